// POST /api/v1/quiz-answers: stores a signed-in learner's answer to one quiz of a lesson (the newest answer wins).
import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { getLesson } from '$lib/server/courses';
import { courseAccessResponse } from '$lib/server/enrolment-access';
import { checkApiAccess } from '$lib/server/guards';
import { lessonQuizIds } from '$lib/server/authoring/published';
import { completeIfQuizzesRight, saveQuizAnswer } from '$lib/server/progress';
import type { RequestHandler } from './$types';

const answerSchema = z.object({
	lessonPath: z.string().regex(/^\/courses\/[a-z0-9-]{1,80}\/[a-z0-9-]{1,80}\/?$/, 'must be a lesson address, /courses/<course>/<lesson>'),
	quizId: z.string().trim().min(1, 'is required').max(100, 'is too long'),
	// the Quiz sends the number typed or the 1-based choice; the text form is kept for other clients
	answer: z.union([z.number().finite(), z.string().trim().min(1).max(200)]),
	// quizzes live in the lesson text and are checked in the browser: the server cannot re-check this
	correct: z.boolean()
});

const problem = (status: number, error: string, message: string) => json({ error, message }, { status });

export const POST: RequestHandler = async ({ locals, request }) => {
	const access = checkApiAccess(locals);
	if (!access.ok) return access.response;

	let raw: unknown;
	try {
		raw = await request.json();
	} catch {
		return problem(400, 'bad-request', 'Send the answer as JSON: {lessonPath, quizId, answer, correct}.');
	}
	const parsed = answerSchema.safeParse(raw);
	if (!parsed.success) {
		const first = parsed.error.issues[0];
		return problem(400, 'bad-request', `${first.path.join('.') || 'body'} ${first.message}`.trim());
	}
	const { lessonPath, quizId, answer, correct } = parsed.data;

	const [, , courseSlug, lessonSlug] = lessonPath.replace(/\/$/, '').split('/');
	const found = await getLesson(courseSlug, lessonSlug);
	if (!found) return problem(404, 'not-found', 'There is no such lesson.');
	if (!found.lesson.freePreview) {
		const refused = await courseAccessResponse(access.user, found.course.id);
		if (refused) return refused;
	}
	const quizIds = await lessonQuizIds(found.lesson);
	if (quizIds && !quizIds.includes(quizId)) return problem(404, 'not-found', `This lesson has no quiz "${quizId}".`);

	await saveQuizAnswer(access.user.id, found.lesson.id, quizId, String(answer), correct);
	const lessonComplete = quizIds ? await completeIfQuizzesRight(access.user.id, found.lesson.id, quizIds) : false;
	return json({ saved: true, quizId, answer: String(answer), correct, lessonComplete });
};
