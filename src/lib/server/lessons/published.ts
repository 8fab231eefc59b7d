// The lessons learners open, each published version rendered once and kept (bounded, in memory): publishing puts the
// render it checked here, and a version not seen yet (another process published it, a file lesson) renders on first read.
import type { Lesson } from '../db/schema';
import { readLessonSource } from './source';
import { renderLessonMarkdown, type RenderedLesson } from './render';

const MAX_CACHED = 64;
const cache = new Map<string, Promise<RenderedLesson | null>>();

type Renderable = Pick<Lesson, 'id' | 'source' | 'body' | 'contentPath' | 'updatedAt'>;

/** The lesson's text rendered: its published body, or for a file lesson the file's Markdown; null when unreadable. */
export function renderPublishedLesson(lesson: Renderable): Promise<RenderedLesson | null> {
	const key = keyOf(lesson);
	const hit = cache.get(key);
	if (hit) {
		// refresh its place: the map's insertion order is the eviction order
		cache.delete(key);
		cache.set(key, hit);
		return hit;
	}
	const rendering = readLessonSource(lesson).then((body) => (body === null ? null : renderLessonMarkdown(body)));
	// a failed render is not remembered: the next request tries again
	rendering.catch(() => cache.delete(key));
	cache.set(key, rendering);
	while (cache.size > MAX_CACHED) cache.delete(cache.keys().next().value!);
	return rendering;
}

/** Forgets every kept render of the lesson (it was published, unpublished or deleted). */
export function forgetRenderedLesson(lessonId: number): void {
	for (const key of [...cache.keys()]) if (key.startsWith(`${lessonId}:`)) cache.delete(key);
}

/** Keeps the render a publish has just checked, so learners never wait for it. */
export function rememberRenderedLesson(lesson: Renderable, rendered: RenderedLesson): void {
	forgetRenderedLesson(lesson.id);
	cache.set(keyOf(lesson), Promise.resolve(rendered));
	while (cache.size > MAX_CACHED) cache.delete(cache.keys().next().value!);
}

const keyOf = (lesson: Renderable) => `${lesson.id}:${lesson.source}:${lesson.updatedAt.getTime()}`;

/** The ids of the lesson's quizzes, from its text; null when the text cannot be read. */
export async function lessonQuizIds(lesson: Renderable): Promise<string[] | null> {
	return (await renderPublishedLesson(lesson))?.quizIds ?? null;
}
