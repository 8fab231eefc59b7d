// Runs the jobs in this process: pg-boss workers for grading and its dead-letter queue, learning records, clip transcoding and the sweep, woken by NOTIFY.
import { and, eq, lt } from 'drizzle-orm';
import type PgBoss from 'pg-boss';
import { client, db } from '../db/index';
import { attempts } from '../db/schema';
import { gradeAttempt, markGradingFailed, type GradeOptions } from './grade-job';
import { sweepUploads } from './uploads/sweep';
import { startDeliveryWorker } from '../learning-records/worker';
import { transcodeClip, type TranscodeJobData } from '../clips/transcode-job';
import { GRADE_FAILED_QUEUE, GRADE_QUEUE, SWEEP_CRON, SWEEP_QUEUE, TRANSCODE_QUEUE, openQueue, queueGrading, registerLocalWorker, WAKE_CHANNEL, type GradeJobData, type QueueOptions } from './queue';
import { expireSeatHold } from '../field-days/booking';
import { publicOrigin } from '../field-days/follow-ups';
import { ensureFieldDayQueues, SEAT_EXPIRY_QUEUE, type SeatExpiryJob } from '../field-days/jobs';
import { ensureReminderQueue, REMINDER_CRON, REMINDER_QUEUE, sendDueReminders } from '../cohorts/reminders';

// a fallback only: a sent job wakes the worker at once
const POLLING_SECONDS = 2;
const SWEEP_EVERY_MS = 60_000;
const STRANDED_AFTER_MS = 60_000;

export interface WorkerOptions extends QueueOptions, GradeOptions {}

export interface RunningWorker {
	id: string;
	stop(): Promise<void>;
}

/**
 * An attempt stored but never queued (the process died between the commit and the send) is sent again.
 * The job id is the attempt id, so an attempt whose job still exists is left alone.
 */
export async function requeueStranded(olderThanMs = STRANDED_AFTER_MS): Promise<number> {
	const stranded = await db
		.select({ id: attempts.id })
		.from(attempts)
		.where(and(eq(attempts.status, 'queued'), lt(attempts.createdAt, new Date(Date.now() - olderThanMs))))
		.limit(100);
	let sent = 0;
	for (const { id } of stranded) if (await queueGrading(id)) sent++;
	return sent;
}

function attemptIdOf(job: PgBoss.Job<GradeJobData>): string | null {
	const id = job.data?.attemptId;
	return typeof id === 'string' && id.length > 0 ? id : null;
}

export async function startGradingWorker(options: WorkerOptions = {}): Promise<RunningWorker> {
	// the process that works the queues also fires the cron schedule (pg-boss lets one instance send each tick)
	const boss = await openQueue({ schedule: true, ...options });
	let id = '';
	id = await boss.work<GradeJobData>(GRADE_QUEUE, { pollingIntervalSeconds: POLLING_SECONDS, batchSize: 1 }, async ([job]) => {
		const attemptId = attemptIdOf(job);
		const outcome = attemptId ? await gradeAttempt(attemptId, options) : 'missing';
		// look for the next job straight away instead of waiting for the polling interval
		boss.notifyWorker(id);
		return { outcome };
	});
	registerLocalWorker(id);
	const deadId = await boss.work<GradeJobData>(GRADE_FAILED_QUEUE, { pollingIntervalSeconds: 2, batchSize: 1 }, async ([job]) => {
		const attemptId = attemptIdOf(job);
		if (attemptId) await markGradingFailed(attemptId);
	});

	await boss.schedule(SWEEP_QUEUE, SWEEP_CRON);
	const sweepId = await boss.work(SWEEP_QUEUE, { pollingIntervalSeconds: 30, batchSize: 1 }, async () => {
		const report = await sweepUploads();
		if (report.uploads || report.strayFiles || report.orphanAttemptFolders || report.clips) console.log('[worker] swept uploads', report);
		return report;
	});

	// learning records (xAPI statements) are sent by the same processes that grade
	const delivery = await startDeliveryWorker(boss);
	// a field-day seat held for a checkout or offered from the waiting list runs out at its time limit
	await ensureFieldDayQueues(boss);
	const seatId = await boss.work<SeatExpiryJob>(SEAT_EXPIRY_QUEUE, { pollingIntervalSeconds: 30, batchSize: 1 }, async ([job]) => {
		const bookingId = Number(job.data?.bookingId);
		return { outcome: Number.isInteger(bookingId) ? await expireSeatHold(bookingId, publicOrigin()) : 'nothing' };
	});

	// reminders before cohort due dates, hourly
	await ensureReminderQueue(boss);
	await boss.schedule(REMINDER_QUEUE, REMINDER_CRON);
	const reminderId = await boss.work(REMINDER_QUEUE, { pollingIntervalSeconds: 30, batchSize: 1 }, async () => ({ sent: await sendDueReminders(publicOrigin()) }));

	// one clip at a time per process: ffmpeg uses every core it is given
	const transcodeId = await boss.work<TranscodeJobData>(TRANSCODE_QUEUE, { pollingIntervalSeconds: POLLING_SECONDS, batchSize: 1 }, async ([job]) => {
		const clipId = typeof job.data?.clipId === 'string' ? job.data.clipId : '';
		return { outcome: clipId ? await transcodeClip(clipId) : 'missing' };
	});
	registerLocalWorker(transcodeId);

	const listener = await client.listen(WAKE_CHANNEL, () => {
		boss.notifyWorker(id);
		boss.notifyWorker(transcodeId);
	}).catch((error: unknown) => {
		console.error('[worker] cannot LISTEN for new jobs; polling only', error instanceof Error ? error.message : error);
		return null;
	});
	const sweep = () => requeueStranded().catch((error: unknown) => console.error('[worker] requeue failed', error instanceof Error ? error.message : error));
	void sweep();
	const timer = setInterval(sweep, SWEEP_EVERY_MS);
	timer.unref();

	return {
		id,
		async stop() {
			clearInterval(timer);
			await listener?.unlisten().catch(() => undefined);
			await boss.offWork({ id });
			await boss.offWork({ id: deadId });
			await boss.offWork({ id: sweepId });
			await delivery.stop();
			await boss.offWork({ id: transcodeId });
			await boss.offWork({ id: seatId });
			await boss.offWork({ id: reminderId });
		}
	};
}

let inline: Promise<RunningWorker | null> | null = null;

/** The worker inside the web app, unless STOPWISE_INLINE_WORKER=0 (then run `npm run worker` beside it). */
export function startInlineWorker(env: NodeJS.ProcessEnv = process.env): Promise<RunningWorker | null> {
	if (env.STOPWISE_INLINE_WORKER === '0') return Promise.resolve(null);
	inline ??= startGradingWorker().catch((error: unknown) => {
		console.error('[worker] could not start; attempts will wait in the queue', error instanceof Error ? error.message : error);
		inline = null;
		return null;
	});
	return inline;
}
