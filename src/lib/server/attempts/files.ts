// Serves an Attempt's frame files to the people allowed to see them; everyone else gets the same 404.
import { and, eq } from 'drizzle-orm';
import { db } from '../db/index';
import { attemptFrames, attempts } from '../db/schema';
import { fileStore, type StoredStream } from '../storage/index';
import { canSeeAttempt, type Viewer } from './access';

export const FILE_VARIANTS = ['original', 'large', 'thumb'] as const;
export type FileVariant = (typeof FILE_VARIANTS)[number];

/** A found file comes as a stream (`file.body`, `file.size`): the route passes it on without holding it in memory. */
export type FileAnswer = { ok: true; file: StoredStream; type: string; filename: string } | { ok: false; status: 401 | 404 };

/** The URL of a frame's file (frame names may hold spaces). */
export function frameFileHref(attemptId: string, frameName: string, variant: FileVariant): string {
	return `/files/attempts/${attemptId}/${encodeURIComponent(frameName)}/${variant}`;
}

export async function readAttemptFile(viewer: Viewer | null, attemptId: string, frameName: string, variant: string): Promise<FileAnswer> {
	if (!viewer) return { ok: false, status: 401 };
	if (!(FILE_VARIANTS as readonly string[]).includes(variant) || attemptId.length > 64) return { ok: false, status: 404 };
	const [row] = await db
		.select({ ownerId: attempts.userId, frame: attemptFrames })
		.from(attemptFrames)
		.innerJoin(attempts, eq(attemptFrames.attemptId, attempts.id))
		.where(and(eq(attemptFrames.attemptId, attemptId), eq(attemptFrames.name, frameName)))
		.limit(1);
	// someone else's attempt looks exactly like a missing one
	if (!row || !canSeeAttempt(viewer, row.ownerId)) return { ok: false, status: 404 };
	const key = variant === 'original' ? row.frame.originalKey : variant === 'large' ? row.frame.largeKey : row.frame.thumbKey;
	const file = await fileStore().open(key);
	if (!file) return { ok: false, status: 404 };
	const extension = key.slice(key.lastIndexOf('.') + 1);
	return {
		ok: true,
		file,
		type: variant === 'original' ? row.frame.mime : 'image/webp',
		filename: `${frameName.replace(/[^A-Za-z0-9_-]/g, '_')}-${variant}.${extension}`
	};
}
