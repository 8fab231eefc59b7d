// The rubric keeps only known items with whole scores 1–4.
import { describe, expect, it } from 'vitest';
import { cleanRubric, RUBRIC, scoreLabel } from './rubric';

describe('rubric', () => {
	it('keeps known items scored 1–4, from numbers or form text', () => {
		expect(cleanRubric({ ambient: '4', light: 2, colour: '', moment: '5', balance: '2.5', bogus: 3 })).toEqual({ ambient: 4, light: 2 });
	});
	it('has unique ids and words for each score', () => {
		expect(new Set(RUBRIC.map((r) => r.id)).size).toBe(RUBRIC.length);
		expect(scoreLabel(3)).toBe('Solid');
		expect(scoreLabel(9)).toBe('9');
	});
});
