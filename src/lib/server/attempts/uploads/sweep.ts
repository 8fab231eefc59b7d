// Sweeps what uploads leave behind: expired or already-used resumable uploads (rows and bytes), bytes with no row,
// temporary folders of one-request uploads, and attempt folders in the file store that no stored attempt owns (a
// process that died between writing the files and committing the rows); for lesson clips, clips whose video never
// finished arriving and clip folders no clip owns (a clip or lesson deleted while its job ran). Run by the pg-boss job in `worker.ts`.
import { readdir, rm, stat } from 'node:fs/promises';
import { join } from 'node:path';
import { inArray } from 'drizzle-orm';
import { db } from '../../db/index';
import { attempts, frameUploads } from '../../db/schema';
import { fileStore } from '../../storage/index';
import { attemptFolder } from '../keys';
import { clipFolder, isClipId } from '../../clips/keys';
import { abandonedClips, deleteClipRow, existingClipIds, knownClipUploads } from '../../clips/records';
import { TEMPORARY_PREFIXES, uploadDir } from './folder';
import { removeUploadFiles, uploadsInTransit, UPLOAD_TTL_MS } from './in-transit';
import { deleteUploadRows, sweepableUploads } from './records';

/** An attempt folder or temporary upload this recent may still be in the middle of its request. */
export const IN_FLIGHT_MS = 60 * 60 * 1000;

export interface SweepReport {
	uploads: number;
	strayFiles: number;
	orphanAttemptFolders: number;
	clips: number;
}

export async function sweepUploads(now = new Date(), ttlMs = UPLOAD_TTL_MS, inFlightMs = IN_FLIGHT_MS): Promise<SweepReport> {
	const report: SweepReport = { uploads: 0, strayFiles: 0, orphanAttemptFolders: 0, clips: 0 };

	const stale = await sweepableUploads(new Date(now.getTime() - ttlMs));
	for (const { id } of stale) await removeUploadFiles(id);
	await deleteUploadRows(stale.map((r) => r.id));
	report.uploads = stale.length;

	// a clip whose video never finished arriving: the clip goes with its bytes (the author adds it again)
	const abandoned = await abandonedClips(new Date(now.getTime() - ttlMs));
	for (const clip of abandoned) {
		if (clip.uploadId) await removeUploadFiles(clip.uploadId);
		await deleteClipRow(clip.id);
	}
	report.clips = abandoned.length + (await sweepOrphanClipFolders(now, inFlightMs));

	report.strayFiles = await sweepStrayUploadFiles(now, ttlMs, inFlightMs);
	report.orphanAttemptFolders = await sweepOrphanAttemptFolders(now, inFlightMs);
	return report;
}

/** Upload bytes whose row is gone (a learner deleted, a crash before the row) and old temporary files of this node. */
async function sweepStrayUploadFiles(now: Date, ttlMs: number, inFlightMs: number): Promise<number> {
	const held = await uploadsInTransit().held();
	const known = new Set<string>();
	for (let i = 0; i < held.length; i += 500) {
		const ids = held.slice(i, i + 500).map((h) => h.id);
		const rows = await db.select({ id: frameUploads.id }).from(frameUploads).where(inArray(frameUploads.id, ids));
		for (const r of rows) known.add(r.id);
		for (const id of await knownClipUploads(ids)) known.add(id);
	}
	let removed = 0;
	for (const { id, modifiedAt } of held) {
		// a row is written before the bytes; one without a row for this long was never going to get one
		if (known.has(id) || now.getTime() - modifiedAt.getTime() <= Math.min(ttlMs, inFlightMs)) continue;
		await removeUploadFiles(id);
		removed++;
	}
	return removed + (await sweepTemporaryFiles(now, inFlightMs));
}

/**
 * This node's temporary files (one-request uploads, copies from the bucket) left by a crash. The workers' sweep runs it
 * on their machine, and each app process once at start, so a node without a worker clears its own folder too.
 */
export async function sweepTemporaryFiles(now = new Date(), inFlightMs = IN_FLIGHT_MS): Promise<number> {
	const dir = uploadDir();
	const names = await readdir(dir).catch(() => [] as string[]);
	let removed = 0;
	for (const name of names.filter((n) => TEMPORARY_PREFIXES.some((prefix) => n.startsWith(prefix)))) {
		const info = await stat(join(dir, name)).catch(() => null);
		if (info && now.getTime() - info.mtime.getTime() > inFlightMs) {
			await rm(join(dir, name), { recursive: true, force: true });
			removed++;
		}
	}
	return removed;
}

async function sweepOrphanAttemptFolders(now: Date, inFlightMs: number): Promise<number> {
	const store = fileStore();
	const folders = (await store.listFolders('attempts')).filter((f) => now.getTime() - f.modifiedAt.getTime() > inFlightMs);
	let removed = 0;
	for (let i = 0; i < folders.length; i += 500) {
		const batch = folders.slice(i, i + 500).map((f) => f.name);
		const rows = await db.select({ id: attempts.id }).from(attempts).where(inArray(attempts.id, batch));
		const owned = new Set(rows.map((r) => r.id));
		for (const name of batch) {
			if (owned.has(name)) continue;
			await store.deletePrefix(attemptFolder(name));
			removed++;
		}
	}
	return removed;
}

async function sweepOrphanClipFolders(now: Date, inFlightMs: number): Promise<number> {
	const store = fileStore();
	const folders = (await store.listFolders('clips')).filter((f) => isClipId(f.name) && now.getTime() - f.modifiedAt.getTime() > inFlightMs);
	let removed = 0;
	for (let i = 0; i < folders.length; i += 500) {
		const batch = folders.slice(i, i + 500).map((f) => f.name);
		const owned = await existingClipIds(batch);
		for (const name of batch) {
			if (owned.has(name)) continue;
			await store.deletePrefix(clipFolder(name));
			removed++;
		}
	}
	return removed;
}
