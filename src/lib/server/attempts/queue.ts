// The grading job queue (pg-boss 10): one instance per process, the queues it needs, and sending a job with a wake-up.
import PgBoss from 'pg-boss';
import { client, databaseUrl } from '../db/index';

export const GRADE_QUEUE = 'grade-attempt';
/** Jobs whose retries ran out land here; a worker marks their attempts as errored. */
export const GRADE_FAILED_QUEUE = 'grade-attempt-failed';
/** NOTIFY channel that wakes grading workers in every process as soon as a job is sent. */
export const WAKE_CHANNEL = 'stopwise_grade';

export interface GradeJobData {
	attemptId: string;
}

/** The hourly sweep of abandoned uploads and orphan attempt folders (`uploads/sweep.ts`), a pg-boss cron job. */
export const SWEEP_QUEUE = 'sweep-uploads';
export const SWEEP_CRON = '23 * * * *';

/** Transcoding of lesson clips (`clips/transcode-job.ts`): one job per clip, its id the clip's. */
export const TRANSCODE_QUEUE = 'transcode-clip';

export interface QueueOptions {
	/** Whether this process fires pg-boss cron schedules (the workers' processes do; a process that only sends, not). */
	schedule?: boolean;
	/** How often this process runs pg-boss maintenance (which retries jobs of crashed workers). */
	maintenanceIntervalSeconds?: number;
}

// grading two 24 MP frames takes about a second; a job still active after this belonged to a dead worker
const EXPIRE_SECONDS = 300;

let opening: Promise<PgBoss> | null = null;
const localWorkers = new Set<string>();

async function open(options: QueueOptions): Promise<PgBoss> {
	const boss = new PgBoss({
		connectionString: databaseUrl,
		application_name: 'stopwise-queue',
		max: 4,
		schedule: options.schedule ?? false,
		maintenanceIntervalSeconds: options.maintenanceIntervalSeconds ?? 30
	});
	boss.on('error', (error) => console.error('[queue]', error.message));
	await boss.start();
	await createQueues(boss);
	return boss;
}

// the first key of the lock below: ours, apart from other advisory locks
const QUEUE_SETUP_LOCK = [0x53575153, 1] as const;

/**
 * Runs `work` while holding a PostgreSQL advisory lock on a connection of its own: pg-boss's createQueue alters tables,
 * and several processes (workers and apps started together on a fresh database) creating the same queues at once
 * deadlock in PostgreSQL. The lock ends with the connection if the process dies.
 */
async function oneProcessAtATime<T>(work: () => Promise<T>): Promise<T> {
	const session = await client.reserve();
	try {
		await session`select pg_advisory_lock(${QUEUE_SETUP_LOCK[0]}::int, ${QUEUE_SETUP_LOCK[1]}::int)`;
		try {
			return await work();
		} finally {
			await session`select pg_advisory_unlock(${QUEUE_SETUP_LOCK[0]}::int, ${QUEUE_SETUP_LOCK[1]}::int)`;
		}
	} finally {
		session.release();
	}
}

/** Creates a pg-boss queue (nothing when it exists) under the setup lock above: the one way queues are made. */
export function ensureQueue(boss: PgBoss, name: string, options: Omit<PgBoss.Queue, 'name'>): Promise<void> {
	return oneProcessAtATime(() => boss.createQueue(name, { ...options, name }));
}

async function createQueues(boss: PgBoss): Promise<void> {
	// the dead-letter queue must exist first
	await ensureQueue(boss, GRADE_FAILED_QUEUE, { retryLimit: 5, retryDelay: 5 });
	await ensureQueue(boss, GRADE_QUEUE, { retryLimit: 3, retryDelay: 1, expireInSeconds: EXPIRE_SECONDS, deadLetter: GRADE_FAILED_QUEUE });
	await ensureQueue(boss, SWEEP_QUEUE, { retryLimit: 1, expireInSeconds: 15 * 60 });
	// a job is retried only when its worker died (the job itself ends every clip ready or failed); a long clip may take a while
	await ensureQueue(boss, TRANSCODE_QUEUE, { retryLimit: 1, retryDelay: 5, expireInSeconds: 2 * 60 * 60 });
}

/** The process's pg-boss, started (and its schema installed) on first use. */
export function openQueue(options: QueueOptions = {}): Promise<PgBoss> {
	opening ??= open(options).catch((error: unknown) => {
		opening = null;
		throw error;
	});
	return opening;
}

/** Stops pg-boss (workers finish or give up their current job); the next openQueue starts afresh. */
export async function closeQueue(): Promise<void> {
	const current = opening;
	opening = null;
	localWorkers.clear();
	if (current) await (await current).stop({ graceful: true, wait: true, timeout: 10_000 }).catch(() => undefined);
}

export function registerLocalWorker(id: string): void {
	localWorkers.add(id);
}

/** Wakes this process's workers at once and every other process's through NOTIFY (so no polling delay). */
export async function wakeGradingWorkers(): Promise<void> {
	if (opening && localWorkers.size) {
		const boss = await opening;
		for (const id of localWorkers) boss.notifyWorker(id);
	}
	await client.notify(WAKE_CHANNEL, '').catch(() => undefined);
}

/**
 * Queues grading of one attempt. The job id is the attempt id: sending again while a job exists does
 * nothing, so a retry of a lost send can never grade twice in parallel by accident.
 */
export async function queueGrading(attemptId: string, options: { expireInSeconds?: number } = {}): Promise<boolean> {
	const boss = await openQueue();
	const id = await boss.send(GRADE_QUEUE, { attemptId } satisfies GradeJobData, { id: attemptId, ...options });
	await wakeGradingWorkers();
	return id !== null;
}
