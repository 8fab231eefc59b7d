// Attempt changes across processes: the grader NOTIFYs on commit; status requests wait for it instead of polling.
import { sql } from 'drizzle-orm';
import { client } from '../db/index';

export const ATTEMPT_CHANNEL = 'stopwise_attempt';

type Waiter = () => void;
const waiters = new Map<string, Set<Waiter>>();
let listening: Promise<unknown> | null = null;

function wake(id: string): void {
	for (const waiter of waiters.get(id) ?? []) waiter();
}

/** One LISTEN connection per process, opened on first use (postgres-js reconnects it by itself). */
function ensureListening(): Promise<unknown> {
	listening ??= client.listen(ATTEMPT_CHANNEL, wake).catch((error: unknown) => {
		listening = null;
		throw error;
	});
	return listening;
}

/** The SQL to run inside the transaction that changes an attempt: delivered when it commits, never before. */
export function notifyAttemptSql(attemptId: string) {
	return sql`select pg_notify(${ATTEMPT_CHANNEL}, ${attemptId})`;
}

/**
 * Reads the attempt, and when `settled` says nothing new happened yet, waits up to `timeoutMs` for a change
 * and reads again. The listener is registered before the first read, so a change in between is not missed.
 */
export async function readWhenChanged<T>(attemptId: string, read: () => Promise<T>, settled: (value: T) => boolean, timeoutMs: number): Promise<T> {
	if (timeoutMs <= 0) return read();
	let woken: Waiter = () => {};
	const changed = new Promise<void>((resolve) => (woken = resolve));
	let set = waiters.get(attemptId);
	if (!set) waiters.set(attemptId, (set = new Set()));
	set.add(woken);
	let timer: ReturnType<typeof setTimeout> | undefined;
	try {
		// without LISTEN the answer is still right, only not early
		await ensureListening().catch(() => undefined);
		const first = await read();
		if (settled(first)) return first;
		await Promise.race([changed, new Promise<void>((resolve) => (timer = setTimeout(resolve, timeoutMs)))]);
		return await read();
	} finally {
		clearTimeout(timer);
		set.delete(woken);
		if (set.size === 0) waiters.delete(attemptId);
	}
}
