// Renders the lessons learners open, remembering recent results (a lesson changes only when it is published).
import type { Lesson } from '../db/schema';
import { readLessonSource } from './source';
import { renderLessonMarkdown, type RenderedLesson } from './render';

const MAX_CACHED = 64;
const cache = new Map<string, Promise<RenderedLesson | null>>();

type Renderable = Pick<Lesson, 'id' | 'source' | 'body' | 'contentPath' | 'updatedAt'>;

/** The lesson's text rendered: its published body, or for a file lesson the file's Markdown; null when unreadable. */
export function renderPublishedLesson(lesson: Renderable): Promise<RenderedLesson | null> {
	const key = `${lesson.id}:${lesson.source}:${lesson.updatedAt.getTime()}`;
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

/** The ids of the lesson's quizzes, from its text; null when the text cannot be read. */
export async function lessonQuizIds(lesson: Renderable): Promise<string[] | null> {
	return (await renderPublishedLesson(lesson))?.quizIds ?? null;
}
