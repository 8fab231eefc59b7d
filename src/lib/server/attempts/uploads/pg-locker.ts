// One lock per resumable upload across every node (@tus/server's Locker on PostgreSQL), so two requests for the same
// upload — a resumed PATCH on node B while the cut one still runs on node A — never write it at once. Each node holds
// its locks as session advisory locks on one connection of its own: a node that dies, or loses that connection, lets go
// of them at once, with no expiry to wait for. A request that finds the upload locked asks its holder to stop (tus's
// request-release: in this process directly, on another node by NOTIFY), then tries again until a time limit.
import { createHash } from 'node:crypto';
import postgres from 'postgres';
import { ERRORS, type Lock, type Locker, type RequestRelease } from '@tus/server';
import { databaseUrl } from '../../db/index';

/** Where a node asks the others to release an upload's lock (the payload is the upload id). */
export const RELEASE_CHANNEL = 'stopwise_upload_lock_release';
/** The first key of every upload lock: ours, apart from other advisory locks (pg-boss uses one-key locks). */
const NAMESPACE = 0x53574c4b;

/** The upload's lock key: 32 bits of its id's SHA-256 (two ids sharing one only wait for each other). */
function keyOf(id: string): number {
	return createHash('sha256').update(id).digest().readInt32BE(0);
}

export interface PgLockerOptions {
	url?: string;
	/** How long a request waits for an upload held elsewhere before tus answers 500 (tus's own default: 30 s). */
	acquireTimeoutMs?: number;
	/** How often a waiting request tries again. */
	retryMs?: number;
}

interface Holder {
	requestRelease: RequestRelease;
}

export class PgLocker implements Locker {
	/** The uploads this node holds (or is taking), each with the way to ask its request to stop. */
	readonly held = new Map<string, Holder>();
	readonly timeoutMs: number;
	readonly retryMs: number;
	private readonly session: postgres.Sql;
	private listening: Promise<unknown> | null = null;

	constructor(options: PgLockerOptions = {}) {
		this.timeoutMs = options.acquireTimeoutMs ?? 30_000;
		this.retryMs = options.retryMs ?? 100;
		this.session = postgres(options.url ?? databaseUrl, {
			max: 1,
			// the locks live as long as this connection: never closed for being idle or old
			idle_timeout: 0,
			max_lifetime: null,
			onnotice: () => {},
			onclose: () => this.lost()
		});
	}

	newLock(id: string): Lock {
		return new PgLock(id, this);
	}

	/** The connection ended (the database restarted, the network dropped): every lock it held is gone, so stop their requests. */
	private lost(): void {
		const holders = [...this.held.values()];
		this.held.clear();
		for (const holder of holders) void Promise.resolve(holder.requestRelease()).catch(() => undefined);
	}

	/** Listens for other nodes' requests to release, once (postgres-js keeps the listening connection up by itself). */
	listen(): Promise<unknown> {
		this.listening ??= this.session
			.listen(RELEASE_CHANNEL, (id) => {
				const holder = this.held.get(id);
				if (holder) void Promise.resolve(holder.requestRelease()).catch(() => undefined);
			})
			.catch((error: unknown) => {
				this.listening = null;
				throw error;
			});
		return this.listening;
	}

	async tryLock(id: string): Promise<boolean> {
		const [row] = await this.session<{ ok: boolean }[]>`select pg_try_advisory_lock(${NAMESPACE}::int, ${keyOf(id)}::int) as ok`;
		return row.ok;
	}

	async unlock(id: string): Promise<void> {
		await this.session`select pg_advisory_unlock(${NAMESPACE}::int, ${keyOf(id)}::int)`;
	}

	async askRelease(id: string): Promise<void> {
		await this.session`select pg_notify(${RELEASE_CHANNEL}, ${id})`;
	}

	/** The server process id of this node's lock connection (tests end it to play a node that died). */
	async backendPid(): Promise<number> {
		const [row] = await this.session<{ pid: number }[]>`select pg_backend_pid() as pid`;
		return row.pid;
	}

	async close(): Promise<void> {
		await this.session.end({ timeout: 5 });
	}
}

class PgLock implements Lock {
	private holder: Holder | null = null;

	constructor(
		private readonly id: string,
		private readonly locker: PgLocker
	) {}

	async lock(signal: AbortSignal, requestRelease: RequestRelease): Promise<void> {
		const { id, locker } = this;
		// without the listener this node could not be asked to let go; waiting requests would time out instead
		await locker.listen().catch(() => undefined);
		const deadline = Date.now() + locker.timeoutMs;
		let askedAt = -Infinity;
		for (;;) {
			if (signal.aborted) throw ERRORS.ERR_LOCK_TIMEOUT;
			const holder = locker.held.get(id);
			const askNow = Date.now() - askedAt >= 1000;
			if (!holder) {
				// taken here first, so a second request of this node waits for this one instead of sharing its session's lock
				const mine: Holder = { requestRelease };
				locker.held.set(id, mine);
				let got = false;
				try {
					got = await locker.tryLock(id);
				} finally {
					if (!got && locker.held.get(id) === mine) locker.held.delete(id);
				}
				if (got) {
					this.holder = mine;
					return;
				}
				// held by another node: ask it to stop its request (again every second, in case it missed the first)
				if (askNow) {
					askedAt = Date.now();
					await locker.askRelease(id);
				}
			} else if (askNow) {
				askedAt = Date.now();
				await holder.requestRelease();
			}
			if (Date.now() >= deadline) throw ERRORS.ERR_LOCK_TIMEOUT;
			await pause(locker.retryMs, signal);
		}
	}

	async unlock(): Promise<void> {
		const { id, locker } = this;
		const mine = this.holder;
		this.holder = null;
		// a lock lost with its connection has nothing left to release
		if (!mine || locker.held.get(id) !== mine) return;
		try {
			await locker.unlock(id);
		} finally {
			if (locker.held.get(id) === mine) locker.held.delete(id);
		}
	}
}

function pause(ms: number, signal: AbortSignal): Promise<void> {
	return new Promise((resolve) => {
		const done = () => {
			clearTimeout(timer);
			signal.removeEventListener('abort', done);
			resolve();
		};
		const timer = setTimeout(done, ms);
		signal.addEventListener('abort', done, { once: true });
	});
}

let shared: PgLocker | undefined;

/** This process's locker (one lock connection per node), made on first use. */
export function uploadLocker(): PgLocker {
	shared ??= new PgLocker();
	return shared;
}

/** Ends this process's lock connection (at shutdown); its locks end with it. */
export async function closeUploadLocker(): Promise<void> {
	const locker = shared;
	shared = undefined;
	await locker?.close();
}
