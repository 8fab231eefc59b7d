// Fake SMTP server for development and tests: accepts every message and keeps it in a folder
// (<id>.eml as received, <id>.json parsed, index.json listing them). Knows nothing of the app.
// Env: FAKE_SMTP_PORT (default 2525), MAILBOX_DIR (default .data/mailbox), FAKE_SMTP_CLEAR=1 empties the folder on start.
import { randomBytes } from 'node:crypto';
import { mkdir, readdir, readFile, rename, rm, writeFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

const port = Number(process.env.FAKE_SMTP_PORT ?? 2525);
const dir = resolve(process.env.MAILBOX_DIR ?? join('.data', 'mailbox'));
const ownFile = /^(\d{13}-[0-9a-f]{8}\.(eml|json)|index\.json)$/;

await mkdir(dir, { recursive: true });
if (process.env.FAKE_SMTP_CLEAR === '1') {
	for (const f of await readdir(dir)) if (ownFile.test(f)) await rm(join(dir, f));
}

/** Writes go through one queue, and each file appears whole (temp file + rename), so readers never see half. */
let queue = Promise.resolve();
const serially = (job) => (queue = queue.then(job, job));

async function writeWhole(path, content) {
	const tmp = `${path}.${process.pid}.tmp`;
	await writeFile(tmp, content);
	await rename(tmp, path);
}

async function readIndex() {
	try {
		const list = JSON.parse(await readFile(join(dir, 'index.json'), 'utf8'));
		return Array.isArray(list) ? list : [];
	} catch {
		return [];
	}
}

async function store(raw, envelope) {
	const parsed = await simpleParser(raw);
	const id = `${Date.now()}-${randomBytes(4).toString('hex')}`;
	const to = envelope.rcptTo.map((r) => r.address.toLowerCase());
	const summary = {
		id,
		receivedAt: new Date().toISOString(),
		from: parsed.from?.text ?? (envelope.mailFrom ? envelope.mailFrom.address : ''),
		to,
		subject: parsed.subject ?? ''
	};
	const message = { ...summary, text: parsed.text ?? '', html: typeof parsed.html === 'string' ? parsed.html : null };
	await serially(async () => {
		await writeWhole(join(dir, `${id}.eml`), raw);
		await writeWhole(join(dir, `${id}.json`), JSON.stringify(message, null, 2));
		const index = await readIndex();
		index.push(summary);
		await writeWhole(join(dir, 'index.json'), JSON.stringify(index, null, 2));
	});
	return id;
}

const server = new SMTPServer({
	// the package's bundled certificate has expired: offer no STARTTLS and take mail without auth
	disabledCommands: ['STARTTLS'],
	authOptional: true,
	logger: false,
	size: 10 * 1024 * 1024,
	onData(stream, session, callback) {
		const chunks = [];
		stream.on('data', (c) => chunks.push(c));
		stream.on('error', callback);
		stream.on('end', () => {
			if (stream.sizeExceeded) return callback(Object.assign(new Error('Message too large'), { responseCode: 552 }));
			store(Buffer.concat(chunks), session.envelope).then(
				(id) => callback(null, `stored as ${id}`),
				(e) => {
					console.error('fake smtp: could not store a message', e);
					callback(Object.assign(new Error('Could not store the message'), { responseCode: 451 }));
				}
			);
		});
	}
});

let listening = false;
server.on('error', (e) => {
	console.error('fake smtp:', e.message);
	if (!listening) process.exit(1); // e.g. the port is taken: fail fast instead of never saying ready
});
server.listen(port, '127.0.0.1', () => {
	listening = true;
	console.log(`ready: fake SMTP on 127.0.0.1:${port}, mailbox ${dir}`);
});

const stop = () => server.close(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
