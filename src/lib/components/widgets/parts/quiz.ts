// Saving a Quiz answer for a signed-in learner; the server checks it against the lesson's own quiz spec.

/** What is sent to the server: the answer only, never a verdict (the server decides whether it is right). */
export interface QuizAnswerRecord {
	lessonPath: string;
	quizId: string;
	answer: number;
}

/** The endpoint that stores quiz answers (another part of the app provides it). */
export const QUIZ_ANSWERS_URL = '/api/v1/quiz-answers';

export type QuizSaveResult = { state: 'saved'; correct: boolean; lessonComplete: boolean } | { state: 'not-saved' };

/** POSTs the answer as JSON; anything but a 2xx reply, or no reply, counts as not saved. */
export async function saveQuizAnswer(send: typeof fetch, record: QuizAnswerRecord): Promise<QuizSaveResult> {
	try {
		const response = await send(QUIZ_ANSWERS_URL, {
			method: 'POST',
			headers: { 'content-type': 'application/json' },
			body: JSON.stringify(record)
		});
		if (!response.ok) return { state: 'not-saved' };
		const body = (await response.json().catch(() => null)) as { correct?: unknown; lessonComplete?: unknown } | null;
		return { state: 'saved', correct: body?.correct === true, lessonComplete: body?.lessonComplete === true };
	} catch {
		return { state: 'not-saved' };
	}
}
