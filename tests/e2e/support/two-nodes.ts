// The scale-out shape on one machine: two app processes (the built app) and two grading workers on one throwaway
// database and one S3 fake, each app with a folder of its own (nothing on one node's disk is seen by the other). Ports
// of their own: the S3 fake on TWO_NODES_S3_PORT (9101), the apps on TWO_NODES_PORTS (9111, 9121). Every process it
// starts is stopped by its pid, and the database and folders are removed.
import { spawn, type ChildProcess } from 'node:child_process';
import { once } from 'node:events';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import postgres from 'postgres';
import { startBuiltApp } from '../../../scripts/bench/app-process';

const ports = () => {
	const apps = (process.env.TWO_NODES_PORTS ?? '9111,9121').split(',').map(Number);
	return { s3: Number(process.env.TWO_NODES_S3_PORT ?? 9101), apps: apps.slice(0, 2) as [number, number] };
};
const TSX = join(process.cwd(), 'node_modules/tsx/dist/cli.mjs');
export const BUCKET = 'stopwise-nodes';

export interface TwoNodes {
	/** The two apps' base URLs: the same app, reached without a proxy, so each request can pick its node. */
	nodes: [string, string];
	/** The public address both apps are configured with (ORIGIN), as behind one proxy. */
	origin: string;
	sql: postgres.Sql;
	s3: { endpoint: string; bucket: string; directory: string };
	uploadDirs: [string, string];
	stop(): Promise<void>;
}

/** This database's name with a suffix: its own database, created fresh, dropped at the end. */
function databaseUrl(suffix: string): string {
	const url = new URL(process.env.DATABASE_URL ?? 'postgres://stopwise@127.0.0.1:54329/stopwise_test');
	url.pathname = `/${url.pathname.slice(1)}${suffix}`;
	return url.toString();
}

/** Starts a child and resolves when its output says `ready`; rejects when it exits first. */
function startReady(args: string[], env: NodeJS.ProcessEnv, children: ChildProcess[]): Promise<ChildProcess> {
	const child = spawn(process.execPath, args, { env, stdio: ['ignore', 'pipe', 'inherit'] });
	children.push(child);
	return new Promise((resolve, reject) => {
		child.stdout!.on('data', (chunk: Buffer) => {
			if (chunk.toString().includes('ready')) resolve(child);
		});
		child.once('exit', (code) => reject(new Error(`${args.join(' ')} exited with ${code} before it was ready`)));
	});
}

/** Runs a script to its end (asynchronously: the S3 fake must keep answering meanwhile). */
async function runScript(args: string[], env: NodeJS.ProcessEnv): Promise<void> {
	const child = spawn(process.execPath, args, { env, stdio: ['ignore', 'ignore', 'inherit'] });
	const [code] = (await once(child, 'exit')) as [number | null];
	if (code !== 0) throw new Error(`${args.join(' ')} exited with ${code}`);
}

/** Stops a child by its pid (SIGTERM, then SIGKILL if it has not ended within a few seconds). */
async function stopChild(child: ChildProcess): Promise<void> {
	if (child.exitCode !== null || child.signalCode !== null) return;
	const exited = once(child, 'exit');
	child.kill('SIGTERM');
	const timer = setTimeout(() => child.kill('SIGKILL'), 8000);
	await exited;
	clearTimeout(timer);
}

export async function startTwoNodes(): Promise<TwoNodes> {
	const { s3: s3Port, apps: appPorts } = ports();
	const folder = await mkdtemp(join(tmpdir(), 'stopwise-two-nodes-'));
	const url = databaseUrl('_nodes');
	const origin = `http://127.0.0.1:${appPorts[0]}`;
	const s3 = { endpoint: `http://127.0.0.1:${s3Port}`, bucket: BUCKET, directory: join(folder, 's3') };
	const shared: NodeJS.ProcessEnv = {
		...process.env,
		DATABASE_URL: url,
		STOPWISE_STORAGE: 's3',
		STOPWISE_S3_BUCKET: BUCKET,
		STOPWISE_S3_ENDPOINT: s3.endpoint,
		STOPWISE_S3_REGION: 'us-east-1',
		STOPWISE_S3_ACCESS_KEY_ID: 'S3RVER',
		STOPWISE_S3_SECRET_ACCESS_KEY: 'S3RVER',
		STOPWISE_S3_PATH_STYLE: 'true',
		FAKE_S3_PORT: String(s3Port),
		FAKE_S3_DIR: s3.directory,
		// learning records wait in this database instead of reaching the suite's record store
		STOPWISE_LRS_ENDPOINT: '',
		STOPWISE_INLINE_WORKER: '0',
		STOPWISE_DATA_DIR: join(folder, 'seed-files')
	};
	const perNode = (name: string): NodeJS.ProcessEnv => ({ STOPWISE_DATA_DIR: join(folder, name, 'files'), STOPWISE_UPLOAD_DIR: join(folder, name, 'uploads') });
	const children: ChildProcess[] = [];
	const sql = postgres(url, { max: 2, onnotice: () => {} });
	const stop = async () => {
		await Promise.all(children.map(stopChild));
		await sql.end();
		const admin = new URL(url);
		const name = admin.pathname.slice(1);
		admin.pathname = '/postgres';
		const adminSql = postgres(admin.toString(), { max: 1, onnotice: () => {} });
		await adminSql.unsafe(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`).finally(() => adminSql.end());
		await rm(folder, { recursive: true, force: true });
	};
	try {
		await startReady(['fakes/s3/server.mjs'], shared, children);
		await runScript([TSX, 'scripts/create-db.ts', '--fresh'], shared);
		await runScript([TSX, 'scripts/migrate.ts'], shared);
		await runScript([TSX, 'scripts/seed.ts'], shared);
		const workers = ['worker-a', 'worker-b'].map((name) => startReady([TSX, 'scripts/worker.ts'], { ...shared, ...perNode(name) }, children));
		const apps = appPorts.map(async (port, i) => {
			const app = await startBuiltApp(port, { ...(shared as Record<string, string>), ...(perNode(`app-${'ab'[i]}`) as Record<string, string>), ORIGIN: origin, BODY_SIZE_LIMIT: '16M' });
			children.push(app);
			return app;
		});
		// every start settles before a failure is raised, so a node that did come up is stopped with the rest
		const started = await Promise.allSettled([...workers, ...apps]);
		const failed = started.find((s) => s.status === 'rejected');
		if (failed) throw failed.reason;
	} catch (error) {
		await stop();
		throw error;
	}
	return {
		nodes: [`http://127.0.0.1:${appPorts[0]}`, `http://127.0.0.1:${appPorts[1]}`],
		origin,
		sql,
		s3,
		uploadDirs: [join(folder, 'app-a', 'uploads'), join(folder, 'app-b', 'uploads')],
		stop
	};
}
