// The frame_uploads rows: which upload is whose, for which frame of which submission, and whether all of it arrived.
import { and, asc, eq, inArray, isNotNull, lt, ne, sql } from 'drizzle-orm';
import { db } from '../../db/index';
import { attempts, frameUploads, type FrameUpload } from '../../db/schema';

export type { FrameUpload };

export async function findUpload(id: string): Promise<FrameUpload | null> {
	const [row] = await db.select().from(frameUploads).where(eq(frameUploads.id, id)).limit(1);
	return row ?? null;
}

/**
 * Records a new upload for one frame of a submission. Choosing another file for the same frame replaces the
 * earlier upload: its id is returned so its bytes can be removed.
 */
export async function recordUpload(row: Omit<FrameUpload, 'createdAt' | 'finishedAt'>): Promise<{ replaced: string | null }> {
	return db.transaction(async (tx) => {
		const [earlier] = await tx
			.select({ id: frameUploads.id })
			.from(frameUploads)
			.where(and(eq(frameUploads.userId, row.userId), eq(frameUploads.submissionKey, row.submissionKey), eq(frameUploads.frameName, row.frameName)))
			.for('update');
		if (earlier) await tx.delete(frameUploads).where(eq(frameUploads.id, earlier.id));
		await tx.insert(frameUploads).values(row);
		return { replaced: earlier?.id ?? null };
	});
}

export async function markFinished(id: string): Promise<void> {
	await db.update(frameUploads).set({ finishedAt: new Date() }).where(eq(frameUploads.id, id));
}

export async function deleteUploadRows(ids: readonly string[]): Promise<void> {
	if (ids.length) await db.delete(frameUploads).where(inArray(frameUploads.id, [...ids]));
}

/** Every upload of one submission (at most one per frame). */
export async function uploadsOfSubmission(userId: string, submissionKey: string): Promise<FrameUpload[]> {
	return db
		.select()
		.from(frameUploads)
		.where(and(eq(frameUploads.userId, userId), eq(frameUploads.submissionKey, submissionKey)))
		.orderBy(asc(frameUploads.createdAt));
}

/** The learner's other submissions still in transit, oldest first (to keep their number bounded). */
export async function otherOpenSubmissions(userId: string, submissionKey: string): Promise<string[]> {
	const rows = await db
		.select({ key: frameUploads.submissionKey, first: sql<Date>`min(${frameUploads.createdAt})` })
		.from(frameUploads)
		.where(and(eq(frameUploads.userId, userId), ne(frameUploads.submissionKey, submissionKey)))
		.groupBy(frameUploads.submissionKey)
		.orderBy(sql`min(${frameUploads.createdAt})`);
	return rows.map((r) => r.key);
}

/** Uploads to sweep: begun before `startedBefore` and never made into an attempt, or whose attempt is already stored. */
export async function sweepableUploads(startedBefore: Date, limit = 500): Promise<{ id: string }[]> {
	const expired = await db.select({ id: frameUploads.id }).from(frameUploads).where(lt(frameUploads.createdAt, startedBefore)).limit(limit);
	const committed = await db
		.select({ id: frameUploads.id })
		.from(frameUploads)
		.innerJoin(attempts, and(eq(attempts.userId, frameUploads.userId), eq(attempts.submissionKey, frameUploads.submissionKey)))
		.where(isNotNull(attempts.id))
		.limit(limit);
	return [...new Map([...expired, ...committed].map((r) => [r.id, r])).values()];
}
