// Quiz renders numeric and multiple-choice questions, tells anonymous visitors to sign in, and flags bad attributes.
import { render } from 'svelte/server';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import Quiz from './Quiz.svelte';
import { attrOf, elementsByTestId, plainText, textOf } from './parts/ssr-html';

const fake = vi.hoisted(() => ({ data: {} as Record<string, unknown>, outside: false }));
vi.mock('$app/state', () => ({
	page: {
		get data() {
			// SvelteKit throws when page state is read outside a request; this stands in for that.
			if (fake.outside) throw new Error('no request');
			return fake.data;
		},
		url: new URL('http://localhost/courses/daylight-flash-for-action/what-a-stop-is')
	}
}));

const show = (props: Record<string, string>) => render(Quiz, { props }).body;

describe('Quiz', () => {
	beforeEach(() => {
		fake.data = {};
		fake.outside = false;
	});

	it('renders a numeric question with its unit, labelled input and check button', () => {
		const body = show({ id: 'stops-1', question: 'How many stops separate 1/125 s and 1/1000 s?', answer: '3', tolerance: '0.2', unit: 'stops' });
		expect(textOf(body, 'quiz-question')).toBe('How many stops separate 1/125 s and 1/1000 s?');
		const inputId = attrOf(body, 'quiz-answer', 'id');
		expect(body).toContain(`for="${inputId}"`);
		expect(attrOf(body, 'quiz-answer', 'inputmode')).toBe('decimal');
		expect(body).toMatch(/>stops<\/span>/);
		expect(attrOf(body, 'quiz-check', 'disabled')).toBeNull();
		expect(elementsByTestId(body, 'widget-notice')).toHaveLength(0);
	});

	it('renders the choices of a multiple-choice question in order', () => {
		const body = show({ id: 'stops-2', question: 'You close from f/5.6 to f/11. The light?', choices: 'It doubles|It halves|It drops to a quarter', answer: '3' });
		const choices = elementsByTestId(body, 'quiz-choice').map(plainText);
		expect(choices).toEqual(['It doubles', 'It halves', 'It drops to a quarter']);
		expect(body.match(/type="radio"/g)).toHaveLength(3);
	});

	it('asks anonymous visitors to sign in, and not signed-in learners', () => {
		const question = { id: 'q', question: 'Two?', answer: '2' };
		expect(textOf(show(question), 'quiz-saving')).toBe('Sign in to keep your answers');
		fake.data = { user: { id: 'u1' } };
		expect(textOf(show(question), 'quiz-saving')).toBe('');
		fake.outside = true;
		expect(textOf(show(question), 'quiz-saving')).toBe('Sign in to keep your answers');
	});

	it('shows a notice and disables checking when the answer is unusable', () => {
		const body = show({ id: 'q', question: 'Which?', choices: 'a|b', answer: '5' });
		expect(textOf(body, 'widget-notice')).toContain('answer="5" must be the number of the right choice, 1 to 2');
		expect(attrOf(body, 'quiz-check', 'disabled')).not.toBeNull();
		const numeric = show({ id: 'q', question: 'How many?', answer: 'three' });
		expect(textOf(numeric, 'widget-notice')).toContain('answer="three" is not a number');
	});

	it('shows a signed-in learner their saved answer again, checked against the question', () => {
		fake.data = { user: { id: 'u1' }, quizAnswers: { 'gn-1': { answer: '24', correct: true }, other: { answer: '9', correct: false } } };
		const body = show({ id: 'gn-1', question: 'GN at 1/4 power?', answer: '24', tolerance: '0.5', unit: 'm' });
		expect(attrOf(body, 'quiz-answer', 'value')).toBe('24');
		expect(textOf(body, 'quiz-result')).toContain('Right: the answer is 24 m');
		expect(textOf(body, 'quiz-saving')).toBe('Your saved answer.');
		const choice = show({ id: 'other', question: 'Which?', choices: 'a|b|c', answer: '2' });
		// the saved choice (3, “c”) is re-checked against the right one (2, “b”)
		expect(textOf(choice, 'quiz-result')).toContain('Not quite: the answer is “b”.');
	});

	it('starts empty when there is no saved answer for this quiz', () => {
		fake.data = { user: { id: 'u1' }, quizAnswers: { elsewhere: { answer: '24', correct: true } } };
		const body = show({ id: 'gn-1', question: 'GN?', answer: '24' });
		expect(attrOf(body, 'quiz-answer', 'value') ?? '').toBe('');
		expect(textOf(body, 'quiz-result')).toBe('');
	});

	it('says answers are not saved in an author’s preview', () => {
		fake.data = { user: { id: 'a1' }, lessonPreview: true };
		expect(textOf(show({ id: 'q', question: 'Two?', answer: '2' }), 'quiz-saving')).toBe('Preview: answers are not saved.');
	});
});
