// Fake Learning Record Store (xAPI 1.0.3, the Statements resource only) for development and tests. Knows nothing of
// the app. Statements are checked by @learninglocker/xapi-validation, kept in memory and in <FAKE_LRS_DIR>/statements.json.
// Env: FAKE_LRS_PORT (default 8371; 0 picks a free one), FAKE_LRS_DIR (default .data/lrs), FAKE_LRS_CLEAR=1 empties it
// on start, FAKE_LRS_USER / FAKE_LRS_PASSWORD (HTTP Basic; defaults below). When STOPWISE_LRS_ENDPOINT points elsewhere
// (a real LRS), it prints `ready (not needed …)` and exits.
// Routes under /xapi/: PUT /statements?statementId=… (204; the same statement again 204, a different one 409),
// POST /statements (one or an array; 200 with the ids), GET /statements (?statementId=… one, else newest first with
// verb, agent, activity, since, until, limit, ascending), GET /about. Every answer carries X-Experience-API-Version.
import { randomUUID } from 'node:crypto';
import { mkdir, readFile, rename, writeFile } from 'node:fs/promises';
import { createServer } from 'node:http';
import { join, resolve } from 'node:path';
import validateStatement from './validate.mjs';

const port = Number(process.env.FAKE_LRS_PORT ?? 8371);
const user = process.env.FAKE_LRS_USER || 'stopwise-local';
const password = process.env.FAKE_LRS_PASSWORD || 'stopwise-local-secret';
const dir = resolve(process.env.FAKE_LRS_DIR ?? join('.data', 'lrs'));
const file = join(dir, 'statements.json');
const VERSION = '1.0.3';
const MAX_BODY = 1024 * 1024;

const endpoint = process.env.STOPWISE_LRS_ENDPOINT;
if (endpoint && port !== 0 && !endpoint.startsWith(`http://127.0.0.1:${port}/`)) {
	console.log('ready (not needed: STOPWISE_LRS_ENDPOINT is another LRS)');
	process.exit(0);
}

/** Statements by id, in the order stored. */
const statements = new Map();
await mkdir(dir, { recursive: true });
if (process.env.FAKE_LRS_CLEAR !== '1') {
	try {
		for (const s of JSON.parse(await readFile(file, 'utf8'))) statements.set(s.id, s);
	} catch {
		// no file yet, or a broken one: start empty
	}
}

let writing = Promise.resolve();
function persist() {
	const text = JSON.stringify([...statements.values()], null, 1);
	writing = writing.then(async () => {
		const tmp = `${file}.${process.pid}.tmp`;
		await writeFile(tmp, text);
		await rename(tmp, file);
	});
	return writing;
}

function send(res, status, body, headers = {}) {
	const text = body === undefined ? '' : JSON.stringify(body);
	res.writeHead(status, {
		'X-Experience-API-Version': VERSION,
		'X-Experience-API-Consistent-Through': new Date().toISOString(),
		...(text ? { 'Content-Type': 'application/json' } : {}),
		...headers
	});
	res.end(text);
}
const problem = (res, status, message) => send(res, status, { error: true, message });

function authorised(req) {
	const header = req.headers.authorization ?? '';
	if (!header.startsWith('Basic ')) return false;
	return Buffer.from(header.slice(6), 'base64').toString('utf8') === `${user}:${password}`;
}

function readBody(req) {
	return new Promise((resolveBody, reject) => {
		const chunks = [];
		let size = 0;
		req.on('data', (c) => {
			size += c.length;
			if (size > MAX_BODY) {
				reject(Object.assign(new Error('The request body is too large.'), { status: 413 }));
				req.destroy();
			} else chunks.push(c);
		});
		req.on('end', () => resolveBody(Buffer.concat(chunks).toString('utf8')));
		req.on('error', reject);
	});
}

/** What the LRS adds on storing (xAPI 1.0.3 §2.4.8–2.4.10): stored, authority, version, and a timestamp if none. */
function stamp(statement) {
	const now = new Date().toISOString();
	return {
		...statement,
		timestamp: statement.timestamp ?? now,
		stored: now,
		authority: { objectType: 'Agent', name: 'Fake LRS', account: { homePage: 'http://127.0.0.1/', name: user } },
		version: statement.version ?? VERSION
	};
}

/** The statement as the client sent it, without what the LRS added: two sends of one statement compare equal. */
function asSent(statement) {
	const { stored: _s, authority: _a, version: _v, ...rest } = statement;
	return rest;
}
function canonical(value) {
	if (Array.isArray(value)) return value.map(canonical);
	if (value && typeof value === 'object') return Object.fromEntries(Object.keys(value).sort().map((k) => [k, canonical(value[k])]));
	return value;
}
const same = (stored, incoming) =>
	JSON.stringify(canonical({ ...asSent(stored), timestamp: undefined })) === JSON.stringify(canonical({ ...asSent(incoming), timestamp: undefined })) &&
	(!incoming.timestamp || Date.parse(incoming.timestamp) === Date.parse(stored.timestamp));

/** Checks a parsed body as one statement; returns a message or null. */
function invalid(statement) {
	const warnings = validateStatement(statement);
	return warnings.length ? `Invalid statement: ${warnings.join('; ')}` : null;
}

/** Stores statements not held yet; a held id with different content is a 409 (xAPI 1.0.3 §2.1.3). Returns the ids. */
async function store(list) {
	const fresh = [];
	for (const s of list) {
		const held = statements.get(s.id);
		if (held && !same(held, s)) return { conflict: s.id };
		if (!held) fresh.push(stamp(s));
	}
	for (const s of fresh) statements.set(s.id, s);
	if (fresh.length) await persist();
	return { ids: list.map((s) => s.id) };
}

function agentMatches(actor, agent) {
	if (!actor) return false;
	if (agent.mbox) return actor.mbox === agent.mbox;
	if (agent.account) return actor.account?.homePage === agent.account.homePage && actor.account?.name === agent.account.name;
	if (agent.openid) return actor.openid === agent.openid;
	if (agent.mbox_sha1sum) return actor.mbox_sha1sum === agent.mbox_sha1sum;
	return false;
}

function query(params) {
	let list = [...statements.values()];
	const verb = params.get('verb');
	if (verb) list = list.filter((s) => s.verb.id === verb);
	const activity = params.get('activity');
	if (activity) list = list.filter((s) => s.object?.id === activity);
	const agentText = params.get('agent');
	if (agentText) {
		const agent = JSON.parse(agentText);
		list = list.filter((s) => agentMatches(s.actor, agent));
	}
	const since = params.get('since');
	if (since) list = list.filter((s) => Date.parse(s.stored) > Date.parse(since));
	const until = params.get('until');
	if (until) list = list.filter((s) => Date.parse(s.stored) <= Date.parse(until));
	if (params.get('ascending') !== 'true') list.reverse();
	const limit = Number(params.get('limit') ?? 0);
	if (limit > 0) list = list.slice(0, limit);
	return list;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[1-8][0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/i;

async function handle(req, res) {
	const url = new URL(req.url ?? '/', 'http://127.0.0.1');
	if (url.pathname === '/xapi/about' && req.method === 'GET') return send(res, 200, { version: [VERSION] });
	if (url.pathname !== '/xapi/statements') return problem(res, 404, 'Not a resource of this LRS.');
	if (!authorised(req)) return send(res, 401, { error: true, message: 'Authentication required.' }, { 'WWW-Authenticate': 'Basic realm="fake LRS"' });
	const version = req.headers['x-experience-api-version'];
	if (typeof version !== 'string' || !/^1\.0(\.\d+)?$/.test(version)) {
		return problem(res, 400, 'Send the header X-Experience-API-Version: 1.0.3.');
	}

	if (req.method === 'GET') {
		const id = url.searchParams.get('statementId');
		if (id) {
			const found = statements.get(id);
			return found ? send(res, 200, found) : problem(res, 404, `No statement ${id}.`);
		}
		try {
			return send(res, 200, { statements: query(url.searchParams), more: '' });
		} catch {
			return problem(res, 400, 'The agent parameter must be JSON.');
		}
	}
	if (req.method !== 'PUT' && req.method !== 'POST') return problem(res, 405, 'Use GET, PUT or POST on /statements.');

	if (!String(req.headers['content-type'] ?? '').startsWith('application/json')) return problem(res, 400, 'Send statements as application/json.');
	let body;
	try {
		body = JSON.parse(await readBody(req));
	} catch (error) {
		return problem(res, error.status ?? 400, error.status ? error.message : 'The body is not JSON.');
	}

	if (req.method === 'PUT') {
		const id = url.searchParams.get('statementId');
		if (!id || !UUID.test(id)) return problem(res, 400, 'PUT needs a statementId parameter holding a UUID.');
		if (Array.isArray(body)) return problem(res, 400, 'PUT takes one statement.');
		if (body && typeof body === 'object' && body.id !== undefined && body.id !== id) return problem(res, 400, 'The statement id differs from statementId.');
		const statement = { ...body, id };
		const message = invalid(statement);
		if (message) return problem(res, 400, message);
		const result = await store([statement]);
		return result.conflict ? problem(res, 409, `Statement ${id} is held with other content.`) : send(res, 204);
	}

	const list = (Array.isArray(body) ? body : [body]).map((s) => (s && typeof s === 'object' && !Array.isArray(s) && s.id === undefined ? { ...s, id: randomUUID() } : s));
	if (list.length === 0) return problem(res, 400, 'Send at least one statement.');
	for (const s of list) {
		const message = invalid(s);
		if (message) return problem(res, 400, message);
	}
	if (new Set(list.map((s) => s.id)).size !== list.length) return problem(res, 400, 'A batch holds two statements with one id.');
	const result = await store(list);
	return result.conflict ? problem(res, 409, `Statement ${result.conflict} is held with other content.`) : send(res, 200, result.ids);
}

const server = createServer((req, res) => {
	handle(req, res).catch((error) => {
		console.error('fake lrs:', error);
		if (!res.headersSent) problem(res, 500, 'The fake LRS failed.');
	});
});
server.on('error', (e) => {
	console.error('fake lrs:', e.message);
	process.exit(1);
});
server.listen(port, '127.0.0.1', () => {
	const address = server.address();
	console.log(`ready: fake LRS on http://127.0.0.1:${address.port}/xapi/ (xAPI ${VERSION}), data ${dir}`);
});
const stop = () => server.close(() => writing.then(() => process.exit(0)));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
