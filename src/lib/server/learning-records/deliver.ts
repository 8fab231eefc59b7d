// Sends what waits in the outbox, oldest first. A statement leaves the backlog only when the LRS took it; an LRS that is
// down or refuses our credentials stops the run (the job is retried with backoff), a statement it calls malformed is set
// aside as rejected so it cannot hold up the others.
import { and, asc, eq, isNull, sql } from 'drizzle-orm';
import type { Statement } from '@xapi/xapi';
import { db } from '../db';
import { learningRecords } from '../db/schema';
import { LrsError, sendStatement } from './client';
import { lrsSettings, type LrsSettings } from './settings';

const BATCH = 50;
const MOST_PER_RUN = 1000;
/** Answers that say "try again later" (or "fix the settings"), not "this statement is wrong". */
const RETRYABLE = new Set([401, 403, 408, 425, 429]);

export interface DeliveryReport {
	configured: boolean;
	sent: number;
	/** the LRS already held the id (409): counted as delivered */
	alreadyHeld: number;
	rejected: number;
	/** the failure that stopped the run, if any (the statements stay waiting) */
	error: string | null;
}

const isRetryable = (error: unknown) => !(error instanceof LrsError) || error.status === null || error.status >= 500 || RETRYABLE.has(error.status);

/** Sends waiting statements until none is left, one fails for a reason that applies to all, or the run's cap is reached. */
export async function deliverWaiting(settings: LrsSettings | null = lrsSettings()): Promise<DeliveryReport> {
	const report: DeliveryReport = { configured: settings !== null, sent: 0, alreadyHeld: 0, rejected: 0, error: null };
	if (!settings) return report;
	for (let done = 0; done < MOST_PER_RUN; ) {
		const batch = await db
			.select({ id: learningRecords.id, statement: learningRecords.statement })
			.from(learningRecords)
			.where(and(isNull(learningRecords.sentAt), eq(learningRecords.rejected, false)))
			.orderBy(asc(learningRecords.createdAt), asc(learningRecords.id))
			.limit(BATCH);
		if (batch.length === 0) break;
		for (const row of batch) {
			done++;
			try {
				const outcome = await sendStatement(settings, row.statement as unknown as Statement & { id: string });
				await db
					.update(learningRecords)
					.set({
						sentAt: new Date(),
						tries: sql`${learningRecords.tries} + 1`,
						lastTriedAt: new Date(),
						lrsStatus: outcome.status,
						lastError: outcome.alreadyHeld ? 'The LRS already held this statement id (409); taken as delivered.' : null
					})
					.where(and(eq(learningRecords.id, row.id), isNull(learningRecords.sentAt)));
				if (outcome.alreadyHeld) report.alreadyHeld++;
				else report.sent++;
			} catch (error) {
				const message = error instanceof Error ? error.message : String(error);
				const retry = isRetryable(error);
				await db
					.update(learningRecords)
					.set({
						tries: sql`${learningRecords.tries} + 1`,
						lastTriedAt: new Date(),
						lastError: message.slice(0, 500),
						lrsStatus: error instanceof LrsError ? error.status : null,
						rejected: !retry
					})
					.where(eq(learningRecords.id, row.id));
				if (retry) {
					report.error = message;
					return report;
				}
				report.rejected++;
			}
		}
	}
	return report;
}
