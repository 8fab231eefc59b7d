#!/usr/bin/env node
// `npm start`, `npm test` and `npm run bench` on a fresh machine: install what is missing,
// run a project-local PostgreSQL, migrate, seed, start the fakes, then serve, test or bench.
// Node built-ins only: this runs before node_modules exists.
import { spawn, spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, readdirSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const mode = process.argv[2] ?? 'start';
const env = { ...process.env };
const children = [];
let stopDatabase = () => {};
let stopsDatabase = false;

const log = (msg) => console.log(`\x1b[33m▸\x1b[0m ${msg}`);
const fail = (msg) => {
	console.error(`\x1b[31m✗ ${msg}\x1b[0m`);
	shutdown(1);
};

function run(cmd, args, opts = {}) {
	const r = spawnSync(cmd, args, { stdio: 'inherit', cwd: root, env, ...opts });
	if (r.error) throw r.error;
	return r.status ?? 1;
}
function must(cmd, args, opts) {
	const code = run(cmd, args, opts);
	if (code !== 0) fail(`${cmd} ${args.join(' ')} exited with ${code}`);
}
function output(cmd, args) {
	const r = spawnSync(cmd, args, { encoding: 'utf8', env });
	return r.status === 0 ? r.stdout.trim() : null;
}
const isRoot = process.getuid?.() === 0;

function aptInstall(pkgs) {
	if (!isRoot) fail(`please install the Debian packages: ${pkgs.join(' ')} (sudo apt-get install -y ${pkgs.join(' ')})`);
	log(`installing Debian packages: ${pkgs.join(' ')}`);
	must('apt-get', ['update', '-qq']);
	must('apt-get', ['install', '-y', '-qq', ...pkgs], { env: { ...env, DEBIAN_FRONTEND: 'noninteractive' } });
}

// ---------- node_modules ----------
function ensureNodeModules() {
	const marker = join(root, 'node_modules', '.package-lock.json');
	const lock = join(root, 'package-lock.json');
	if (existsSync(marker) && statSync(marker).mtimeMs >= statSync(lock).mtimeMs) return;
	log('installing npm packages (npm ci)');
	must('npm', ['ci', '--no-audit', '--no-fund']);
}

// ---------- PostgreSQL ----------
function pgBinDir() {
	const fromConfig = output('pg_config', ['--bindir']);
	if (fromConfig && existsSync(join(fromConfig, 'initdb'))) return fromConfig;
	const base = '/usr/lib/postgresql';
	if (existsSync(base)) {
		const versions = readdirSync(base).sort((a, b) => Number(b) - Number(a));
		for (const v of versions) if (existsSync(join(base, v, 'bin', 'initdb'))) return join(base, v, 'bin');
	}
	return null;
}

/** PostgreSQL refuses to run as root: run its programs as the `postgres` system user then. */
function asPg(bin, args) {
	return isRoot ? ['runuser', ['-u', 'postgres', '--', bin, ...args]] : [bin, args];
}

function chooseDataDir() {
	const preferred = env.STOPWISE_PGDATA ?? join(root, '.data', 'pg');
	if (!isRoot) return preferred;
	mkdirSync(preferred, { recursive: true });
	run('chown', ['postgres:postgres', preferred], { stdio: 'ignore' });
	const [cmd, args] = asPg('test', ['-w', preferred, '-a', '-x', preferred]);
	if (run(cmd, args, { stdio: 'ignore' }) === 0) return preferred;
	// a parent folder is closed to the postgres user (a home of mode 700): use the temp dir
	const id = createHash('sha1').update(root).digest('hex').slice(0, 10);
	const fallback = join(tmpdir(), `stopwise-pg-${id}`);
	log(`the postgres user cannot reach ${preferred}; keeping the database in ${fallback}`);
	mkdirSync(fallback, { recursive: true });
	run('chown', ['postgres:postgres', fallback]);
	return fallback;
}

async function ensureDatabase(dbName) {
	const fresh = mode === 'test' || mode === 'bench';
	if (env.DATABASE_URL) {
		log('using DATABASE_URL (no local cluster started)');
		if (fresh) {
			const url = new URL(env.DATABASE_URL);
			url.pathname = `/${dbName}`;
			env.DATABASE_URL = url.toString();
		}
	} else {
		env.DATABASE_URL = await startLocalCluster(dbName);
	}
	tsx('scripts/create-db.ts', fresh ? ['--fresh'] : []);
}

async function startLocalCluster(dbName) {
	let bin = pgBinDir();
	if (!bin) {
		aptInstall(['postgresql']);
		bin = pgBinDir();
		if (!bin) fail('PostgreSQL was installed but its programs were not found');
	}
	const port = env.STOPWISE_PGPORT ?? '54329';
	const data = chooseDataDir();
	if (!existsSync(join(data, 'PG_VERSION'))) {
		log(`creating a PostgreSQL cluster in ${data}`);
		const [c, a] = asPg(join(bin, 'initdb'), ['-D', data, '-U', 'stopwise', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
		must(c, a, { stdio: ['ignore', 'ignore', 'inherit'] });
	}
	const pgCtl = (args, opts) => {
		const [c, a] = asPg(join(bin, 'pg_ctl'), ['-D', data, ...args]);
		return run(c, a, opts);
	};
	if (pgCtl(['status'], { stdio: 'ignore' }) === 0) {
		log(`PostgreSQL already running in ${data}`);
	} else {
		log(`starting PostgreSQL on 127.0.0.1:${port}`);
		const logFile = join(data, 'server.log');
		const opts = `-c listen_addresses=127.0.0.1 -p ${port} -k ${data}`;
		if (pgCtl(['-o', opts, '-l', logFile, '-w', '-t', '60', 'start'], { stdio: ['ignore', 'ignore', 'inherit'] }) !== 0) {
			fail(`PostgreSQL did not start; see ${logFile}`);
		}
		stopsDatabase = true;
		stopDatabase = () => {
			log('stopping PostgreSQL');
			pgCtl(['-m', 'fast', '-w', 'stop'], { stdio: 'ignore' });
		};
	}
	return `postgres://stopwise@127.0.0.1:${port}/${dbName}`;
}

// ---------- fakes ----------
/** Each fakes/<name>/server.mjs is started with the environment; it prints one line when ready. */
async function startFakes() {
	const dir = join(root, 'fakes');
	if (!existsSync(dir)) return;
	for (const name of readdirSync(dir).sort()) {
		const entry = join(dir, name, 'server.mjs');
		if (!existsSync(entry)) continue;
		await new Promise((resolveReady, reject) => {
			const child = spawn(process.execPath, [entry], { cwd: root, env, stdio: ['ignore', 'pipe', 'inherit'] });
			children.push(child);
			let ready = false;
			child.stdout.on('data', (chunk) => {
				const text = chunk.toString();
				if (!ready && text.includes('ready')) {
					ready = true;
					log(`fake ${name}: ${text.trim().split('\n')[0]}`);
					resolveReady();
				}
			});
			child.on('exit', (code) => {
				if (!ready) reject(new Error(`fake ${name} exited with ${code}`));
			});
		}).catch((e) => fail(e.message));
	}
}

/**
 * Payments: the fake in fakes/stripe on its own port per mode (like the SMTP one), and the app pointed at it,
 * unless STRIPE_SECRET_KEY is given: then the app talks to the real service (STRIPE_API_* unset).
 */
function setPaymentDefaults() {
	env.STRIPE_FAKE_PORT ??= { start: '12111', test: '12112', bench: '12113' }[mode];
	env.STRIPE_FAKE_PUBLIC_URL ??= `http://127.0.0.1:${env.STRIPE_FAKE_PORT}`;
	// where the fake sends signed events: the app this mode serves (start: PORT/ORIGIN; test: Playwright's server)
	const appOrigin = mode === 'test' ? `http://127.0.0.1:${env.E2E_PORT ?? '4173'}` : (env.ORIGIN ?? `http://127.0.0.1:${env.PORT ?? '3000'}`);
	env.STRIPE_WEBHOOK_URL ??= `${appOrigin.replace(/\/+$/, '')}/api/v1/payments/webhook`;
	if (!env.STRIPE_SECRET_KEY) {
		env.STRIPE_SECRET_KEY = 'sk_test_stopwise_local';
		env.STRIPE_API_HOST ??= '127.0.0.1';
		env.STRIPE_API_PORT ??= env.STRIPE_FAKE_PORT;
		env.STRIPE_API_PROTOCOL ??= 'http';
		env.STRIPE_WEBHOOK_SECRET ??= 'whsec_stopwise_local';
	}
}

/**
 * Object storage: with STOPWISE_STORAGE=s3 and no STOPWISE_S3_ENDPOINT, the app is pointed at the fake in fakes/s3
 * (its own port and folder per mode). Local disk stays the default and then the fake starts nothing.
 */
function setStorageDefaults() {
	if (env.STOPWISE_STORAGE !== 's3' || env.STOPWISE_S3_ENDPOINT) return;
	env.FAKE_S3_PORT ??= { start: '4568', test: '4569', bench: '4570' }[mode];
	env.FAKE_S3_DIR ??= join(root, '.data', mode === 'start' ? 's3' : `s3-${mode}`);
	env.STOPWISE_S3_ENDPOINT = `http://127.0.0.1:${env.FAKE_S3_PORT}`;
	env.STOPWISE_S3_BUCKET ??= 'stopwise';
	env.STOPWISE_S3_REGION ??= 'us-east-1';
	// the fake's own fixed credentials
	env.STOPWISE_S3_ACCESS_KEY_ID ??= 'S3RVER';
	env.STOPWISE_S3_SECRET_ACCESS_KEY ??= 'S3RVER';
}

/**
 * Learning records: unless STOPWISE_LRS_ENDPOINT names a real Learning Record Store, the app sends its xAPI statements
 * to the fake in fakes/lrs (its own port, folder and fixed credentials per mode; emptied for test and bench runs).
 */
function setLearningRecordDefaults() {
	if (env.STOPWISE_LRS_ENDPOINT) return;
	env.FAKE_LRS_PORT ??= { start: '8371', test: '8372', bench: '8373' }[mode];
	env.FAKE_LRS_DIR ??= join(root, '.data', mode === 'start' ? 'lrs' : `lrs-${mode}`);
	if (mode !== 'start') env.FAKE_LRS_CLEAR ??= '1';
	env.FAKE_LRS_USER ??= 'stopwise-local';
	env.FAKE_LRS_PASSWORD ??= 'stopwise-local-secret';
	env.STOPWISE_LRS_ENDPOINT = `http://127.0.0.1:${env.FAKE_LRS_PORT}/xapi/`;
	env.STOPWISE_LRS_USER = env.FAKE_LRS_USER;
	env.STOPWISE_LRS_PASSWORD = env.FAKE_LRS_PASSWORD;
}

// ---------- app steps ----------
const tsx = (script, args = []) => must(process.execPath, [join(root, 'node_modules/tsx/dist/cli.mjs'), script, ...args]);
const bin = (name) => join(root, 'node_modules', '.bin', name);

const onPath = (tool) => (env.PATH ?? '').split(':').some((dir) => dir && existsSync(join(dir, tool)));

/**
 * Debian's decoders for frames sharp cannot read: LibRaw's tools (libraw-bin) decode raw files; the tests also make
 * HEIC frames with heif-enc (libheif-examples). HEIC itself is decoded by libheif-js from npm, so needs nothing here.
 * Without root `npm start` carries on, and raw files are refused with a message saying the decoder is missing.
 */
function ensureFrameDecoders() {
	const wanted = [
		['raw-identify', 'libraw-bin'],
		['dcraw_emu', 'libraw-bin']
	];
	if (mode === 'test' || mode === 'bench') wanted.push(['heif-enc', 'libheif-examples']);
	const missing = [...new Set(wanted.filter(([tool]) => !onPath(tool)).map(([, pkg]) => pkg))];
	if (missing.length === 0) return;
	if (!isRoot && mode === 'start') {
		log(`raw files will be refused until these Debian packages are installed: ${missing.join(' ')}`);
		return;
	}
	aptInstall(missing);
}

/**
 * Debian's ffmpeg (ffmpeg and ffprobe): lesson clips are transcoded by it, and the seed renders the demo clip with it.
 * Without root `npm start` carries on: clips then fail with a message saying ffmpeg is missing, the demo clip is left out.
 */
function ensureFfmpeg() {
	if (onPath('ffmpeg') && onPath('ffprobe')) return;
	if (!isRoot && mode === 'start') {
		log('lesson clips cannot be transcoded until the Debian package ffmpeg is installed');
		return;
	}
	aptInstall(['ffmpeg']);
}

function ensureChromium() {
	const path = env.CHROMIUM_PATH ?? '/usr/bin/chromium';
	if (existsSync(path)) return;
	aptInstall(['chromium']);
}

function build() {
	log('building the app');
	must(bin('vite'), ['build', '--logLevel', 'warn']);
}

function shutdown(code) {
	for (const c of children) if (c.exitCode === null) c.kill('SIGTERM');
	stopDatabase();
	stopDatabase = () => {};
	process.exit(code);
}
process.on('SIGINT', () => shutdown(130));
process.on('SIGTERM', () => shutdown(143));

function serve() {
	const port = env.PORT ?? '3000';
	const host = env.HOST ?? '0.0.0.0';
	env.PORT = port;
	env.ORIGIN ??= `http://localhost:${port}`;
	// the largest request body adapter-node accepts: a lesson image (15 MB) or one 8 MiB part of a resumable frame
	// upload; frames of any size come in parts, forms are bounded at 2 MB by the input gate (src/lib/server/edge)
	env.BODY_SIZE_LIMIT ??= '16M';
	const app = spawn(process.execPath, ['build'], { cwd: root, env, stdio: 'inherit' });
	children.push(app);
	app.on('exit', (code) => shutdown(code ?? 0));
	const demo = JSON.parse(readFileSync(join(root, 'scripts', 'demo-accounts.json'), 'utf8'));
	whenHealthy(`http://127.0.0.1:${port}/api/health`, () => {
		console.log(`\n  Stopwise is running at \x1b[1m${env.ORIGIN}\x1b[0m (listening on ${host}:${port})\n`);
		console.log('  Demo sign-ins (invented people, demo only):');
		for (const a of demo) console.log(`    ${a.role.padEnd(8)} ${a.email.padEnd(34)} ${a.password}`);
		console.log(`\n  Ctrl-C stops the app${stopsDatabase ? ' and the database' : ''}.\n`);
	});
}

/** Calls `ready` once the app answers its health check (polled; the app may take a moment to listen). */
function whenHealthy(url, ready, triesLeft = 120) {
	fetch(url)
		.then((r) => (r.ok ? ready() : Promise.reject(new Error(String(r.status)))))
		.catch(() => (triesLeft > 0 ? setTimeout(() => whenHealthy(url, ready, triesLeft - 1), 250) : log(`the app did not answer ${url}`)));
}

async function main() {
	const started = Date.now();
	ensureNodeModules();
	const dbName = { start: 'stopwise', db: 'stopwise', test: env.STOPWISE_TEST_DB ?? 'stopwise_test', bench: 'stopwise_bench' }[mode];
	if (!dbName) fail(`unknown mode ${mode}`);
	await ensureDatabase(dbName);
	ensureFrameDecoders();
	ensureFfmpeg();
	env.STOPWISE_DATA_DIR ??= join(root, '.data', mode === 'start' ? 'files' : `files-${mode}`);
	log('applying migrations');
	tsx('scripts/migrate.ts');
	log('seeding the demo');
	tsx('scripts/seed.ts');
	if (mode === 'db') {
		// the database alone, left running: for development against `vite dev`
		log(`DATABASE_URL=${env.DATABASE_URL}`);
		process.exit(0);
	}
	// fake SMTP: its own port and mailbox per mode, so `npm start` and `npm test` can run at once
	env.FAKE_SMTP_PORT ??= { start: '2525', test: '2526', bench: '2527' }[mode];
	env.MAILBOX_DIR ??= join(root, '.data', mode === 'start' ? 'mailbox' : `mailbox-${mode}`);
	if (mode !== 'start') env.FAKE_SMTP_CLEAR ??= '1';
	setPaymentDefaults();
	setStorageDefaults();
	setLearningRecordDefaults();
	await startFakes();
	if (mode === 'start') {
		build();
		serve();
		return;
	}
	if (mode === 'bench') {
		// the page-load benchmark measures the built app; `npm run bench -- grading` runs only the benchmarks whose name holds the word
		build();
		tsx('scripts/bench.ts', process.argv.slice(3));
		shutdown(0);
	}
	// test
	ensureChromium();
	must(bin('svelte-kit'), ['sync']);
	const steps = [
		['svelte-check', [bin('svelte-check'), ['--tsconfig', './tsconfig.json', '--fail-on-warnings', '--output', 'human']]],
		['vitest', [bin('vitest'), ['run']]]
	];
	for (const [name, [cmd, args]] of steps) {
		log(name);
		if (run(cmd, args) !== 0) fail(`${name} failed`);
	}
	build();
	log('playwright');
	if (run(bin('playwright'), ['test']) !== 0) fail('playwright failed');
	log(`all checks passed in ${Math.round((Date.now() - started) / 1000)} s`);
	shutdown(0);
}

main().catch((e) => fail(e.stack ?? String(e)));
