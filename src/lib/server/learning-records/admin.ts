// The admin view of learning records: where they go, the backlog (counts, the last error) and the last statements sent;
// "retry now" puts rejected statements back in the backlog and wakes the sender.
import { and, count, desc, eq, isNotNull, isNull, max, min } from 'drizzle-orm';
import { db } from '../db';
import { learningRecords, users, type LearningRecordKind } from '../db/schema';
import { deliverSoon } from './outbox';
import { lrsProblem, lrsSettings } from './settings';

export interface StatementLine {
	id: string;
	kind: LearningRecordKind;
	learner: string;
	verb: string;
	object: string;
	at: string;
	tries: number;
	lrsStatus: number | null;
	lastError: string | null;
}

export interface LearningRecordsOverview {
	/** the LRS endpoint (no credentials), or null when none is configured */
	endpoint: string | null;
	/** why the configured endpoint cannot be used, if so */
	problem: string | null;
	waiting: number;
	rejected: number;
	sent: number;
	oldestWaitingAt: string | null;
	lastSentAt: string | null;
	lastError: { message: string; at: string } | null;
	recentSent: StatementLine[];
	backlog: StatementLine[];
}

const LIST = 20;

function display(map: unknown): string {
	if (!map || typeof map !== 'object') return '';
	const values = Object.values(map as Record<string, unknown>).filter((v): v is string => typeof v === 'string');
	return values[0] ?? '';
}

type Row = { id: string; kind: LearningRecordKind; name: string; statement: Record<string, unknown>; createdAt: Date; sentAt: Date | null; tries: number; lrsStatus: number | null; lastError: string | null };

function line(row: Row): StatementLine {
	const verb = row.statement.verb as { id?: string; display?: unknown } | undefined;
	const object = row.statement.object as { id?: string; definition?: { name?: unknown } } | undefined;
	return {
		id: row.id,
		kind: row.kind,
		learner: row.name,
		verb: display(verb?.display) || verb?.id || '',
		object: display(object?.definition?.name) || object?.id || '',
		at: (row.sentAt ?? row.createdAt).toISOString(),
		tries: row.tries,
		lrsStatus: row.lrsStatus,
		lastError: row.lastError
	};
}

const columns = {
	id: learningRecords.id,
	kind: learningRecords.kind,
	name: users.name,
	statement: learningRecords.statement,
	createdAt: learningRecords.createdAt,
	sentAt: learningRecords.sentAt,
	tries: learningRecords.tries,
	lrsStatus: learningRecords.lrsStatus,
	lastError: learningRecords.lastError
};

export async function learningRecordsOverview(): Promise<LearningRecordsOverview> {
	const waitingNow = and(isNull(learningRecords.sentAt), eq(learningRecords.rejected, false));
	const [[waiting], [rejected], [sent], [lastFailure], recentSent, backlog] = await Promise.all([
		db.select({ n: count(), oldest: min(learningRecords.createdAt) }).from(learningRecords).where(waitingNow),
		db.select({ n: count() }).from(learningRecords).where(and(isNull(learningRecords.sentAt), eq(learningRecords.rejected, true))),
		db.select({ n: count(), last: max(learningRecords.sentAt) }).from(learningRecords).where(isNotNull(learningRecords.sentAt)),
		db
			.select({ message: learningRecords.lastError, at: learningRecords.lastTriedAt })
			.from(learningRecords)
			.where(and(isNull(learningRecords.sentAt), isNotNull(learningRecords.lastError)))
			.orderBy(desc(learningRecords.lastTriedAt))
			.limit(1),
		db.select(columns).from(learningRecords).innerJoin(users, eq(learningRecords.userId, users.id)).where(isNotNull(learningRecords.sentAt)).orderBy(desc(learningRecords.sentAt)).limit(LIST),
		db.select(columns).from(learningRecords).innerJoin(users, eq(learningRecords.userId, users.id)).where(isNull(learningRecords.sentAt)).orderBy(learningRecords.createdAt).limit(LIST)
	]);
	return {
		endpoint: lrsSettings()?.shown ?? null,
		problem: lrsProblem(),
		waiting: waiting.n,
		rejected: rejected.n,
		sent: sent.n,
		oldestWaitingAt: waiting.oldest?.toISOString() ?? null,
		lastSentAt: sent.last?.toISOString() ?? null,
		lastError: lastFailure?.message && lastFailure.at ? { message: lastFailure.message, at: lastFailure.at.toISOString() } : null,
		recentSent: recentSent.map(line),
		backlog: backlog.map(line)
	};
}

/** Puts statements the LRS refused back in the backlog and wakes the sender; returns how many came back. */
export async function retryNow(): Promise<number> {
	const back = await db
		.update(learningRecords)
		.set({ rejected: false })
		.where(and(isNull(learningRecords.sentAt), eq(learningRecords.rejected, true)))
		.returning({ id: learningRecords.id });
	deliverSoon();
	return back.length;
}
