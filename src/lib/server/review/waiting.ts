// How much waits in the review queue: graded, not yet reviewed Attempts, and how many of them the file could not decide.
import { and, count, eq, inArray, sql } from 'drizzle-orm';
import { db } from '../db/index';
import { attempts } from '../db/schema';

export interface WaitingCount {
	/** open Attempts in the queue (graded or failed to grade, not reviewed yet) */
	open: number;
	/** of those, the ones whose automatic verdict hands the decision to a mentor */
	needsMentor: number;
}

export async function countWaiting(): Promise<WaitingCount> {
	const [row] = await db
		.select({ open: count(), needsMentor: sql<number>`count(*) filter (where ${attempts.verdict} = 'needs-review')`.mapWith(Number) })
		.from(attempts)
		.where(and(eq(attempts.reviewState, 'open'), inArray(attempts.status, ['graded', 'error'])));
	return { open: row?.open ?? 0, needsMentor: row?.needsMentor ?? 0 };
}
