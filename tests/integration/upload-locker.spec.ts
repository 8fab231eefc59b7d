// The upload lock across nodes against the real PostgreSQL: two lockers are two nodes. The second waits while the
// first holds an upload, asks it to let go (tus's request-release, carried by NOTIFY), and takes the lock once it is
// released; a node whose connection dies loses its locks at once; a wait ends at its time limit or when the request goes.
import { randomBytes } from 'node:crypto';
import { afterAll, describe, expect, test } from 'vitest';
import { ERRORS } from '@tus/server';
import { client } from '$lib/server/db';
import { PgLocker } from '$lib/server/attempts/uploads/pg-locker';

const lockers: PgLocker[] = [];
function node(options: ConstructorParameters<typeof PgLocker>[0] = {}) {
	const locker = new PgLocker({ retryMs: 20, ...options });
	lockers.push(locker);
	return locker;
}
const uploadId = () => randomBytes(16).toString('hex');
const never = () => new AbortController().signal;

/** A promise and whether it has settled yet, to say "still waiting" without a clock. */
function watch<T>(promise: Promise<T>) {
	const state = { settled: false, promise };
	promise.then(
		() => (state.settled = true),
		() => (state.settled = true)
	);
	return state;
}

/** `first` takes the upload's lock; a lock of `second` then waits. Returns once the holder was asked to let go. */
async function heldThenAsked(first: PgLocker, second: PgLocker, id: string) {
	let askedToRelease!: () => void;
	const asked = new Promise<void>((resolve) => (askedToRelease = resolve));
	const holder = first.newLock(id);
	await holder.lock(never(), () => askedToRelease());
	const waiter = second.newLock(id);
	const waiting = watch(waiter.lock(never(), () => {}));
	await asked;
	return { holder, waiter, waiting };
}

afterAll(async () => {
	await Promise.all(lockers.map((l) => l.close()));
});

describe('the upload lock shared by every node', () => {
	test('a second node waits for the first, asks it to release, and takes the lock once it is released', async () => {
		const a = node();
		const b = node();
		const id = uploadId();
		// node A hears node B's request through PostgreSQL, while B still waits
		const { holder, waiter, waiting } = await heldThenAsked(a, b, id);
		expect(waiting.settled).toBe(false);

		await holder.unlock();
		await waiting.promise;
		expect(b.held.has(id)).toBe(true);
		expect(a.held.has(id)).toBe(false);
		await waiter.unlock();
		expect(b.held.has(id)).toBe(false);
	});

	test('two requests on one node take turns too (one session never shares its lock between requests)', async () => {
		const a = node();
		const id = uploadId();
		const { holder, waiter, waiting } = await heldThenAsked(a, a, id);
		expect(waiting.settled).toBe(false);
		await holder.unlock();
		await waiting.promise;
		await waiter.unlock();
		// and a third node can now take it straight away
		const other = node().newLock(id);
		await other.lock(never(), () => {});
		await other.unlock();
	});

	test('different uploads do not wait for each other', async () => {
		const a = node();
		const b = node();
		const one = a.newLock(uploadId());
		const two = b.newLock(uploadId());
		await one.lock(never(), () => {});
		await two.lock(never(), () => {});
		await Promise.all([one.unlock(), two.unlock()]);
		expect(a.held.size + b.held.size).toBe(0);
	});

	test('a node that dies (its connection ends) loses its locks at once: another node takes them, the dead one’s requests are stopped', async () => {
		const a = node();
		const b = node();
		const id = uploadId();
		let stopped!: () => void;
		const stoppedA = new Promise<void>((resolve) => (stopped = resolve));
		const lockA = a.newLock(id);
		await lockA.lock(never(), () => stopped());

		await client`select pg_terminate_backend(${await a.backendPid()})`;
		await stoppedA;
		const lockB = b.newLock(id);
		await lockB.lock(never(), () => {});
		expect(b.held.has(id)).toBe(true);
		// the dead node's request finishing later releases nothing of B's
		await lockA.unlock();
		const third = node({ acquireTimeoutMs: 200 }).newLock(id);
		await expect(third.lock(never(), () => {})).rejects.toBe(ERRORS.ERR_LOCK_TIMEOUT);
		await lockB.unlock();
	});

	test('a wait ends with tus’s lock timeout when the holder never lets go, and at once when the request is aborted', async () => {
		const a = node();
		const id = uploadId();
		const held = a.newLock(id);
		await held.lock(never(), () => {});

		const patient = node({ acquireTimeoutMs: 200 }).newLock(id);
		await expect(patient.lock(never(), () => {})).rejects.toBe(ERRORS.ERR_LOCK_TIMEOUT);

		const gone = new AbortController();
		const impatient = node().newLock(id);
		const waiting = impatient.lock(gone.signal, () => {});
		gone.abort();
		await expect(waiting).rejects.toBe(ERRORS.ERR_LOCK_TIMEOUT);
		await held.unlock();
	});
});
