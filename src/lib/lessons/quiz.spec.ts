// Quiz checking shared by the widget and the server: attribute reading and answer checking at the tolerance edges.
import { describe, expect, it } from 'vitest';
import { checkAnswer, readQuizSpec } from './quiz';

describe('readQuizSpec', () => {
	it('reads a numeric question', () => {
		expect(readQuizSpec({ id: 'stops-1', answer: '3', tolerance: '0.2', unit: 'stops' })).toEqual({
			spec: { kind: 'numeric', answer: 3, tolerance: 0.2, unit: 'stops' },
			notices: []
		});
	});
	it('reads a multiple-choice question', () => {
		expect(readQuizSpec({ id: 'q', choices: 'a | b|c', answer: '2' }).spec).toEqual({ kind: 'choice', choices: ['a', 'b', 'c'], answer: 2 });
	});
	it('refuses what it cannot check, saying why', () => {
		expect(readQuizSpec({ id: 'q', answer: 'three' })).toEqual({ spec: null, notices: ['answer="three" is not a number.'] });
		expect(readQuizSpec({ id: 'q', choices: 'a|b', answer: '3' }).notices).toEqual(['answer="3" must be the number of the right choice, 1 to 2.']);
		expect(readQuizSpec({ id: 'q', choices: 'only one', answer: '1' }).spec).toBeNull();
		expect(readQuizSpec({ answer: '1' }).notices).toContain('id is missing: answers cannot be saved without it.');
	});
	it('checks exactly when the tolerance is unusable', () => {
		const read = readQuizSpec({ id: 'q', answer: '2', tolerance: '-1' });
		expect(read.spec).toEqual({ kind: 'numeric', answer: 2, tolerance: 0, unit: '' });
		expect(read.notices).toHaveLength(1);
	});
});

describe('checkAnswer', () => {
	const spec = { kind: 'numeric', answer: 3, tolerance: 0.2, unit: 'stops' } as const;
	it('accepts answers within the tolerance, edges included', () => {
		expect(checkAnswer(spec, 3.2).correct).toBe(true);
		expect(checkAnswer(spec, 2.8).correct).toBe(true);
		expect(checkAnswer(spec, 3.21).correct).toBe(false);
		expect(checkAnswer(spec, 3).explanation).toBe('Right: the answer is 3 stops (anything within ±0.2 counts).');
		expect(checkAnswer(spec, 4).explanation).toBe('Not quite: the answer is 3 stops (anything within ±0.2 counts).');
	});
	it('names the right choice', () => {
		const choice = { kind: 'choice', choices: ['It doubles', 'It halves', 'It drops to a quarter'], answer: 3 } as const;
		expect(checkAnswer(choice, 3)).toEqual({ correct: true, explanation: 'Right: the answer is “It drops to a quarter”.' });
		expect(checkAnswer(choice, 1).correct).toBe(false);
	});
});
