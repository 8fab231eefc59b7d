// pg-boss jobs of field days: a held or offered seat runs out at its time limit (a persisted job, not a timer in the web process).
import type PgBoss from 'pg-boss';
import { ensureQueue, openQueue } from '../attempts/queue';

export const SEAT_EXPIRY_QUEUE = 'field-day-seat-expiry';

export interface SeatExpiryJob {
	bookingId: number;
}

export async function ensureFieldDayQueues(boss: PgBoss): Promise<void> {
	await ensureQueue(boss, SEAT_EXPIRY_QUEUE, { retryLimit: 5, retryDelay: 30, expireInSeconds: 300 });
}

/** Queues the expiry check of one booking's hold for `at`; the job itself re-reads the booking, so a stale job does nothing. */
export async function scheduleSeatExpiry(bookingId: number, at: Date): Promise<void> {
	const boss = await openQueue();
	await ensureFieldDayQueues(boss);
	await boss.send(SEAT_EXPIRY_QUEUE, { bookingId } satisfies SeatExpiryJob, { startAfter: at });
}
