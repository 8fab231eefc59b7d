// Saving a Quiz answer: the answer only (never a verdict), the server's verdict read back, any reply but 2xx as not saved.
import { describe, expect, it, vi } from 'vitest';
import { QUIZ_ANSWERS_URL, saveQuizAnswer } from './quiz';

describe('saveQuizAnswer', () => {
	const record = { lessonPath: '/courses/daylight-flash-for-action/what-a-stop-is', quizId: 'stops-1', answer: 3 };
	it('POSTs the record as JSON and reads the server\'s verdict from a 2xx', async () => {
		const send = vi.fn(async () => Response.json({ saved: true, correct: false, lessonComplete: false }, { status: 200 }));
		await expect(saveQuizAnswer(send as unknown as typeof fetch, record)).resolves.toEqual({ state: 'saved', correct: false, lessonComplete: false });
		expect(send).toHaveBeenCalledWith(QUIZ_ANSWERS_URL, {
			method: 'POST',
			headers: { 'content-type': 'application/json' },
			body: JSON.stringify(record)
		});
		expect(QUIZ_ANSWERS_URL).toBe('/api/v1/quiz-answers');
		const completing = async () => Response.json({ saved: true, correct: true, lessonComplete: true });
		await expect(saveQuizAnswer(completing as unknown as typeof fetch, record)).resolves.toEqual({ state: 'saved', correct: true, lessonComplete: true });
	});
	it('reports any other status, or a network failure, as not saved', async () => {
		for (const status of [302, 401, 404, 500]) {
			const send = async () => new Response(null, { status });
			await expect(saveQuizAnswer(send as unknown as typeof fetch, record)).resolves.toEqual({ state: 'not-saved' });
		}
		const offline = async () => {
			throw new TypeError('failed to fetch');
		};
		await expect(saveQuizAnswer(offline as unknown as typeof fetch, record)).resolves.toEqual({ state: 'not-saved' });
	});
});
