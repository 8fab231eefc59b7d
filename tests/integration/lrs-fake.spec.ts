// The Learning Record Store fake on its own, as any xAPI client sees it: headers, credentials, validation, ids, storage.
import { spawn, type ChildProcess } from 'node:child_process';
import { once } from 'node:events';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';

const SERVER = fileURLToPath(new URL('../../fakes/lrs/server.mjs', import.meta.url));
const AUTH = `Basic ${Buffer.from('k:s').toString('base64')}`;
const JSON_HEADERS = { 'X-Experience-API-Version': '1.0.3', 'Content-Type': 'application/json', Authorization: AUTH };

let dir: string;
let child: ChildProcess;
let base: string;

async function start(): Promise<void> {
	child = spawn(process.execPath, [SERVER], { env: { ...process.env, FAKE_LRS_PORT: '0', FAKE_LRS_DIR: dir, FAKE_LRS_USER: 'k', FAKE_LRS_PASSWORD: 's', STOPWISE_LRS_ENDPOINT: '', FAKE_LRS_CLEAR: '0' }, stdio: ['ignore', 'pipe', 'inherit'] });
	const port = await new Promise<number>((resolve, reject) => {
		let out = '';
		child.stdout?.on('data', (c: Buffer) => {
			out += c.toString();
			const m = /ready: fake LRS on http:\/\/127\.0\.0\.1:(\d+)\//.exec(out);
			if (m) resolve(Number(m[1]));
		});
		child.on('close', (code) => reject(new Error(`fake LRS exited with ${code}`)));
	});
	base = `http://127.0.0.1:${port}/xapi`;
}
async function stop(): Promise<void> {
	if (child.exitCode !== null) return;
	const exited = once(child, 'exit');
	child.kill('SIGTERM');
	await exited;
}

const statement = (name: string) => ({
	actor: { objectType: 'Agent', account: { homePage: 'https://school.example', name } },
	verb: { id: 'http://adlnet.gov/expapi/verbs/completed', display: { en: 'completed' } },
	object: { objectType: 'Activity', id: 'https://school.example/xapi/activities/lesson/c/l' }
});

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'stopwise-lrs-fake-'));
	await start();
});
afterAll(async () => {
	await stop();
	rmSync(dir, { recursive: true, force: true });
});

describe('LRS fake', () => {
	test('every answer names the xAPI version; a request without the version header is a 400, without credentials a 401', async () => {
		const about = await fetch(`${base}/about`);
		expect(about.headers.get('x-experience-api-version')).toBe('1.0.3');
		expect(await about.json()).toEqual({ version: ['1.0.3'] });
		const noVersion = await fetch(`${base}/statements`, { headers: { Authorization: AUTH } });
		expect(noVersion.status).toBe(400);
		expect(noVersion.headers.get('x-experience-api-version')).toBe('1.0.3');
		expect((await fetch(`${base}/statements`, { headers: { 'X-Experience-API-Version': '1.0.3' } })).status).toBe(401);
		expect((await fetch(`${base}/statements`, { headers: { ...JSON_HEADERS, Authorization: `Basic ${Buffer.from('k:wrong').toString('base64')}` } })).status).toBe(401);
	});

	test('POST stores one or many and answers their ids; two with one id in a batch, or a malformed one, is a 400 and stores nothing', async () => {
		const one = await fetch(`${base}/statements`, { method: 'POST', headers: JSON_HEADERS, body: JSON.stringify(statement('a')) });
		expect(one.status).toBe(200);
		const [id] = (await one.json()) as string[];
		expect(id).toMatch(/^[0-9a-f-]{36}$/);
		const twin = { ...statement('b'), id: 'a1b2c3d4-0000-4000-8000-000000000001' };
		expect((await fetch(`${base}/statements`, { method: 'POST', headers: JSON_HEADERS, body: JSON.stringify([twin, twin]) })).status).toBe(400);
		const broken = await fetch(`${base}/statements`, { method: 'POST', headers: JSON_HEADERS, body: JSON.stringify([statement('c'), { ...statement('d'), verb: {} }]) });
		expect(broken.status).toBe(400);
		expect(((await broken.json()) as { message: string }).message).toMatch(/verb/);
		expect((await fetch(`${base}/statements`, { method: 'POST', headers: JSON_HEADERS, body: 'not json' })).status).toBe(400);
		const all = (await (await fetch(`${base}/statements`, { headers: JSON_HEADERS })).json()) as { statements: { id: string; stored: string; authority: unknown; version: string }[] };
		expect(all.statements.map((s) => s.id)).toEqual([id]);
		expect(all.statements[0]).toMatchObject({ version: '1.0.3', authority: expect.any(Object), stored: expect.any(String) });
	});

	test('PUT needs a statementId; the same statement again is 204, other content under that id 409; GET by id finds it', async () => {
		const id = 'a1b2c3d4-0000-4000-8000-000000000002';
		const put = (body: unknown, query = `?statementId=${id}`) => fetch(`${base}/statements${query}`, { method: 'PUT', headers: JSON_HEADERS, body: JSON.stringify(body) });
		expect((await put(statement('e'), '')).status).toBe(400);
		expect((await put(statement('e'))).status).toBe(204);
		expect((await put(statement('e'))).status).toBe(204);
		expect((await put(statement('f'))).status).toBe(409);
		const found = await fetch(`${base}/statements?statementId=${id}`, { headers: JSON_HEADERS });
		expect(((await found.json()) as { actor: { account: { name: string } } }).actor.account.name).toBe('e');
		expect((await fetch(`${base}/statements?statementId=a1b2c3d4-0000-4000-8000-00000000dead`, { headers: JSON_HEADERS })).status).toBe(404);
	});

	test('statements are kept in the data folder and read back after a restart; filters by agent and verb', async () => {
		const onDisk = JSON.parse(readFileSync(join(dir, 'statements.json'), 'utf8')) as unknown[];
		expect(onDisk).toHaveLength(2);
		await stop();
		await start();
		const agent = encodeURIComponent(JSON.stringify({ account: { homePage: 'https://school.example', name: 'e' } }));
		const byAgent = (await (await fetch(`${base}/statements?agent=${agent}&verb=${encodeURIComponent('http://adlnet.gov/expapi/verbs/completed')}`, { headers: JSON_HEADERS })).json()) as { statements: unknown[] };
		expect(byAgent.statements).toHaveLength(1);
	});
});
