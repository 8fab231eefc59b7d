// The lesson page's completion, shared with its quizzes: a quiz whose saved answer completes the lesson says so at once.
import { getContext, setContext } from 'svelte';

export interface LessonCompletion {
	readonly completed: boolean;
	markComplete(): void;
}

const KEY = Symbol('lesson-completion');

/** Called by the lesson page while it initialises. */
export function provideLessonCompletion(completion: LessonCompletion): void {
	setContext(KEY, completion);
}

/** Called by a widget while it initialises; undefined outside a lesson page (the author's preview, a bare render). */
export function lessonCompletion(): LessonCompletion | undefined {
	return getContext<LessonCompletion | undefined>(KEY);
}
