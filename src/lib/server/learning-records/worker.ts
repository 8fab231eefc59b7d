// The delivery job (pg-boss): one queue whose jobs each send the backlog; sent on NOTIFY after an event and every
// minute by cron, retried with backoff while the LRS is down. The queue is "stately": one waiting and one running job.
import type PgBoss from 'pg-boss';
import { ensureQueue } from '../attempts/queue';
import { client } from '../db';
import { deliverWaiting } from './deliver';
import { DELIVERY_CHANNEL } from './outbox';

export const DELIVERY_QUEUE = 'deliver-learning-records';
export const DELIVERY_CRON = '* * * * *';

export async function createDeliveryQueue(boss: PgBoss): Promise<void> {
	// retries after about 5 s, 10 s, 20 s … (backoff); whatever is still waiting is picked up by the next minute's job
	await ensureQueue(boss, DELIVERY_QUEUE, { policy: 'stately', retryLimit: 6, retryDelay: 5, retryBackoff: true, expireInSeconds: 10 * 60 });
}

/** Sends a delivery job unless one already waits (the stately queue refuses a second; send then returns null). */
export async function queueDelivery(boss: PgBoss): Promise<string | null> {
	return boss.send(DELIVERY_QUEUE, {});
}

export interface RunningDelivery {
	stop(): Promise<void>;
}

/** Works the delivery queue in this process; the caller's pg-boss fires the schedule. */
export async function startDeliveryWorker(boss: PgBoss): Promise<RunningDelivery> {
	await createDeliveryQueue(boss);
	await boss.schedule(DELIVERY_QUEUE, DELIVERY_CRON);
	const id = await boss.work(DELIVERY_QUEUE, { pollingIntervalSeconds: 2, batchSize: 1 }, async () => {
		const report = await deliverWaiting();
		// a failure that applies to the whole backlog: fail the job so pg-boss retries it later
		if (report.error) throw new Error(report.error);
		return report;
	});
	const wake = () =>
		queueDelivery(boss)
			.then(() => boss.notifyWorker(id))
			.catch((error: unknown) => console.error('[learning-records] could not queue delivery', error instanceof Error ? error.message : error));
	const listener = await client.listen(DELIVERY_CHANNEL, wake).catch((error: unknown) => {
		console.error('[learning-records] cannot LISTEN; delivering every minute only', error instanceof Error ? error.message : error);
		return null;
	});
	void wake();
	return {
		async stop() {
			await listener?.unlisten().catch(() => undefined);
			await boss.offWork({ id });
		}
	};
}
