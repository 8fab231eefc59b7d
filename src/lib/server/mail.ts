// Sends e-mail through nodemailer over SMTP: a real server from SMTP_* env vars, else the local fake.
import nodemailer, { type Transporter } from 'nodemailer';

/** `icalEvent`: an RFC 5545 calendar sent as the message's text/calendar part and an `.ics` attachment (nodemailer's option). */
export type Letter = { to: string; subject: string; text: string; html: string; icalEvent?: { method: string; filename: string; content: string } };
export type SendResult = { ok: true } | { ok: false; reason: string };

/** Port of the fake SMTP server in fakes/smtp (bootstrap sets it per mode; 2525 otherwise). */
export const fakeSmtpPort = Number(process.env.FAKE_SMTP_PORT ?? 2525);

export function describeTransport(env: NodeJS.ProcessEnv = process.env) {
	if (!env.SMTP_HOST) {
		// the fake's certificate story is not worth having: it offers no STARTTLS, so do not ask for it
		return { host: '127.0.0.1', port: Number(env.FAKE_SMTP_PORT ?? 2525), secure: false, ignoreTLS: true, fake: true } as const;
	}
	const secure = env.SMTP_SECURE === 'true' || env.SMTP_SECURE === '1';
	return {
		host: env.SMTP_HOST,
		port: Number(env.SMTP_PORT ?? (secure ? 465 : 587)),
		secure,
		auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASS ?? '' } : undefined,
		fake: false
	} as const;
}

let transporter: Transporter | undefined;

function getTransporter(): Transporter {
	if (!transporter) {
		const { fake: _fake, ...options } = describeTransport();
		transporter = nodemailer.createTransport({ ...options, connectionTimeout: 10_000, greetingTimeout: 10_000 });
	}
	return transporter;
}

export const mailFrom = process.env.MAIL_FROM ?? 'Stopwise <no-reply@stopwise.example>';

/** Sends one message with plain-text and HTML parts; a failure is a value, logged once, never a throw. */
export async function sendLetter(letter: Letter): Promise<SendResult> {
	try {
		await getTransporter().sendMail({ from: mailFrom, ...letter });
		return { ok: true };
	} catch (e) {
		console.error(`[mail] could not send "${letter.subject}"`, e instanceof Error ? e.message : e);
		return { ok: false, reason: 'We could not send the e-mail just now.' };
	}
}

const pending = new Set<Promise<unknown>>();

/**
 * Mail sent after the answer (receipts, sign-up notices): the page or the provider does not wait for it, but it is
 * tracked, so tests can wait until every such mail has gone instead of guessing with a sleep.
 */
export function sendInBackground(what: string, work: () => Promise<unknown>): void {
	const task: Promise<unknown> = work()
		.catch((e: unknown) => console.error(`[mail] ${what} failed`, e instanceof Error ? e.message : e))
		.finally(() => pending.delete(task));
	pending.add(task);
}

/** Resolves once no background mail is in flight (including mail queued while waiting). */
export async function backgroundMailDrained(): Promise<void> {
	while (pending.size) await Promise.allSettled([...pending]);
}
