// The built app as a child process for benchmarks that measure it from outside (pages under load, memory of uploads).
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

/** Starts `node build` on 127.0.0.1:`port` with `env` added, and waits for its health check. */
export async function startBuiltApp(port: number, env: Record<string, string> = {}): Promise<ChildProcess> {
	if (!existsSync(join(process.cwd(), 'build', 'index.js'))) throw new Error('no built app in build/: run `npm run build` first');
	const origin = `http://127.0.0.1:${port}`;
	const app = spawn(process.execPath, ['build'], {
		// the port and host are this function's own: `env` (often a copy of process.env) never moves them
		env: { ...process.env, ORIGIN: origin, ...env, PORT: String(port), HOST: '127.0.0.1' },
		stdio: ['ignore', 'ignore', 'inherit']
	});
	for (let tries = 0; tries < 120; tries++) {
		if (app.exitCode !== null) throw new Error(`the app exited with ${app.exitCode}`);
		const ok = await fetch(`${origin}/api/health`).then((r) => r.ok, () => false);
		if (ok) return app;
		await new Promise((r) => setTimeout(r, 250));
	}
	app.kill();
	throw new Error(`the app did not answer on port ${port}`);
}

/** A process's resident memory now and its peak since the last reset, in bytes (Linux /proc). */
export function memoryOf(pid: number): { rss: number; peak: number } {
	const status = readFileSync(`/proc/${pid}/status`, 'utf8');
	const kb = (name: string) => Number(new RegExp(`^${name}:\\s+(\\d+) kB`, 'm').exec(status)?.[1] ?? NaN) * 1024;
	return { rss: kb('VmRSS'), peak: kb('VmHWM') };
}

/** Resets the peak (VmHWM) to the current resident size, so the next peak belongs to what runs next. */
export function resetPeak(pid: number): void {
	writeFileSync(`/proc/${pid}/clear_refs`, '5');
}
