// Waits for a message in the fake SMTP server's mailbox and pulls links out of it.
import { listMail, readMail, type MailMessage } from '$lib/server/mailbox';

export async function waitForMail(to: string, subject: RegExp, timeoutMs = 10_000): Promise<MailMessage> {
	const deadline = Date.now() + timeoutMs;
	while (Date.now() < deadline) {
		const hit = (await listMail()).find((m) => m.to.includes(to.toLowerCase()) && subject.test(m.subject));
		if (hit) return (await readMail(hit.id))!;
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error(`no mail to ${to} matching ${subject} within ${timeoutMs} ms (is fakes/smtp running?)`);
}

export function linkIn(message: MailMessage, path: string): URL {
	const match = message.text.match(new RegExp(`https?://[^\\s]+${path.replace('/', '\\/')}\\?token=[\\w-]+`));
	if (!match) throw new Error(`no ${path} link in "${message.subject}"`);
	return new URL(match[0]);
}
