// Reads the demo mailbox that the fake SMTP server (fakes/smtp) keeps in MAILBOX_DIR.
import { readFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { z } from 'zod';

export const mailboxDir = resolve(process.env.MAILBOX_DIR ?? join(process.cwd(), '.data', 'mailbox'));

/** The fake names each message `<epoch ms>-<8 hex>`; anything else never reaches the file system. */
const messageId = /^\d{13}-[0-9a-f]{8}$/;

const summarySchema = z.object({
	id: z.string().regex(messageId),
	receivedAt: z.string(),
	from: z.string(),
	to: z.array(z.string()),
	subject: z.string()
});
const messageSchema = summarySchema.extend({ text: z.string(), html: z.string().nullable() });

function parseJson(raw: string): unknown {
	try {
		return JSON.parse(raw);
	} catch {
		return null;
	}
}

export type MailSummary = z.infer<typeof summarySchema>;
export type MailMessage = z.infer<typeof messageSchema>;

/** Newest first; an empty list when the fake has not stored anything yet (or real SMTP is in use). */
export async function listMail(): Promise<MailSummary[]> {
	const raw = await readFile(join(mailboxDir, 'index.json'), 'utf8').catch(() => '[]');
	const parsed = z.array(summarySchema).safeParse(parseJson(raw));
	return parsed.success ? parsed.data.toReversed() : [];
}

export async function readMail(id: string): Promise<MailMessage | null> {
	if (!messageId.test(id)) return null;
	const raw = await readFile(join(mailboxDir, `${id}.json`), 'utf8').catch(() => null);
	if (!raw) return null;
	const parsed = messageSchema.safeParse(parseJson(raw));
	return parsed.success ? parsed.data : null;
}

/** Splits plain text into text and link pieces so a page can render the links without {@html}. */
export function splitLinks(text: string): { text: string; href?: string }[] {
	const parts: { text: string; href?: string }[] = [];
	let last = 0;
	for (const m of text.matchAll(/https?:\/\/[^\s<>"]+/g)) {
		if (m.index > last) parts.push({ text: text.slice(last, m.index) });
		parts.push({ text: m[0], href: m[0] });
		last = m.index + m[0].length;
	}
	if (last < text.length) parts.push({ text: text.slice(last) });
	return parts;
}
