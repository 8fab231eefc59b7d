// POST /api/v1/quiz-answers: stores a signed-in learner's answer to one quiz of a lesson (the newest answer wins),
// checked here against the lesson's own quiz: a verdict sent by the browser is never trusted.
import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { getLesson } from '$lib/server/courses';
import { checkApiAccess } from '$lib/server/guards';
import { renderPublishedLesson } from '$lib/server/lessons/published';
import { checkQuizAnswer } from '$lib/server/lessons/quiz';
import { apiAccess, decideAccess } from '$lib/server/lessons/access';
import { guardOf } from '$lib/server/lessons/page';
import { completeIfQuizzesRight, saveQuizAnswer } from '$lib/server/progress';
import type { RequestHandler } from './$types';

const answerSchema = z.object({
	lessonPath: z.string().regex(/^\/courses\/[a-z0-9-]{1,80}\/[a-z0-9-]{1,80}\/?$/, 'must be a lesson address, /courses/<course>/<lesson>'),
	quizId: z.string().trim().min(1, 'is required').max(100, 'is too long'),
	// the Quiz sends the number typed or the 1-based choice; the text form is kept for other clients
	answer: z.union([z.number().finite(), z.string().trim().min(1).max(200)]),
	// older clients sent their own verdict: still read (a wrong type is a 400) but ignored, the server decides
	correct: z.boolean().optional()
});

const problem = (status: number, error: string, message: string) => json({ error, message }, { status });

export const POST: RequestHandler = async ({ locals, request }) => {
	const access = checkApiAccess(locals);
	if (!access.ok) return access.response;

	let raw: unknown;
	try {
		raw = await request.json();
	} catch {
		return problem(400, 'bad-request', 'Send the answer as JSON: {lessonPath, quizId, answer}.');
	}
	const parsed = answerSchema.safeParse(raw);
	if (!parsed.success) {
		const first = parsed.error.issues[0];
		return problem(400, 'bad-request', `${first.path.join('.') || 'body'} ${first.message}`.trim());
	}
	const { lessonPath, quizId, answer } = parsed.data;

	const [, , courseSlug, lessonSlug] = lessonPath.replace(/\/$/, '').split('/');
	const found = await getLesson(courseSlug, lessonSlug);
	const refused = apiAccess(await decideAccess(access.user, guardOf(found)));
	if (refused || !found) return refused!;
	const rendered = await renderPublishedLesson(found.lesson);
	const verdict = rendered ? checkQuizAnswer(rendered.segments, rendered.quizIds, quizId, answer) : { kind: 'no-quiz' as const };
	if (verdict.kind === 'no-quiz') return problem(404, 'not-found', `This lesson has no quiz "${quizId}".`);

	await saveQuizAnswer(access.user.id, found.lesson.id, quizId, String(answer), verdict.correct);
	const lessonComplete = await completeIfQuizzesRight(access.user.id, found.lesson.id, verdict.quizIds);
	return json({ saved: true, quizId, answer: String(answer), correct: verdict.correct, lessonComplete });
};
