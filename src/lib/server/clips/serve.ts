// A clip's files for the player: the same access rule as the lesson's text (no address works without it), the videos in
// byte ranges (206, Accept-Ranges) so playback starts at once and seeking fetches only what it needs.
import { json } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
import { db } from '../db/index';
import { courses, lessonClips, lessons, modules } from '../db/schema';
import { apiAccess, decideAccess, type Viewer } from '../lessons/access';
import { fileStore } from '../storage/index';
import { CLIP_FILE, clipKey, isClipId, POSTER_FILE } from './keys';
import { readRange } from './range';

const MISSING = 'There is no such clip.';
const missing = () => json({ error: 'not-found', message: MISSING }, { status: 404 });

/** A clip with what the rule needs: its lesson's course, whether the lesson is open to all, and whether both are published. */
async function clipWithPlace(id: string) {
	const [row] = await db
		.select({ clip: lessonClips, courseId: courses.id, courseSlug: courses.slug, free: lessons.freePreview, published: lessons.published, coursePublished: courses.published })
		.from(lessonClips)
		.innerJoin(lessons, eq(lessonClips.lessonId, lessons.id))
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(eq(lessonClips.id, id))
		.limit(1);
	return row ?? null;
}

// paid material: a shared cache must never keep it; the browser may, for the session's length
const PRIVATE = 'private, max-age=3600';

export async function clipFileResponse(viewer: Viewer, id: string, file: string, rangeHeader: string | null): Promise<Response> {
	if (!isClipId(id) || !CLIP_FILE.test(file)) return missing();
	const found = await clipWithPlace(id);
	// authors see every clip (drafts included, for the preview); everyone else by the lesson's rule, published lessons only
	const author = viewer?.roles.includes('author') ?? false;
	const visible = found && (author || (found.published && found.coursePublished));
	const access = visible ? (author ? 'open' : await decideAccess(viewer, { courseId: found.courseId, courseSlug: found.courseSlug, free: found.free })) : 'missing';
	const refused = apiAccess(access, MISSING);
	if (refused) return refused;
	const clip = found!.clip;
	if (clip.status !== 'ready') return missing();

	if (file === 'captions.vtt') {
		return new Response(clip.captions, { headers: { 'content-type': 'text/vtt; charset=utf-8', 'cache-control': PRIVATE } });
	}
	const store = fileStore();
	if (file === POSTER_FILE) {
		const opened = await store.open(clipKey(id, file));
		if (!opened) return missing();
		return new Response(opened.body, { headers: { 'content-type': 'image/jpeg', 'content-length': String(opened.size), 'cache-control': PRIVATE } });
	}
	const rendition = clip.renditions.find((r) => r.file === file);
	if (!rendition) return missing();
	const size = rendition.bytes;
	const base = { 'content-type': rendition.type, 'accept-ranges': 'bytes', 'cache-control': PRIVATE };
	const range = readRange(rangeHeader, size);
	if (range.kind === 'unsatisfiable') return new Response(null, { status: 416, headers: { ...base, 'content-range': `bytes */${size}` } });
	if (range.kind === 'whole') {
		const opened = await store.open(clipKey(id, file));
		if (!opened) return missing();
		return new Response(opened.body, { headers: { ...base, 'content-length': String(opened.size) } });
	}
	const opened = await store.openRange(clipKey(id, file), range.start, range.end);
	if (!opened) return missing();
	return new Response(opened.body, {
		status: 206,
		headers: { ...base, 'content-length': String(opened.size), 'content-range': `bytes ${range.start}-${range.start + opened.size - 1}/${size}` }
	});
}
