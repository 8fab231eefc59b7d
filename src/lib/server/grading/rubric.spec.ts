// The rubric an Assignment asks for: the author's items, else defaults per kind of criterion (colour only with a colour check).
import { describe, expect, it } from 'vitest';
import { cleanRubric, DEFAULT_RUBRIC_BY_KIND, RUBRIC_ITEMS, rubricFor } from './rubric';
import { CRITERION_KINDS, validateSpec } from './spec';

const ids = (items: { id: string }[]) => items.map((i) => i.id);

describe('rubricFor', () => {
	it('asks about colour only when a colour criterion is present', () => {
		const plain = rubricFor({ criteria: [{ kind: 'ambient-under' }, { kind: 'subject-lift' }] });
		expect(ids(plain)).toEqual(['ambient', 'light', 'balance', 'moment']);
		expect(ids(plain)).not.toContain('colour');
		const gelled = rubricFor({ criteria: [{ kind: 'ambient-under' }, { kind: 'background-cooler' }] });
		expect(ids(gelled)).toEqual(['ambient', 'colour', 'moment']);
	});

	it('follows the kinds: a bracket asks about its steps and settings, not the flash', () => {
		expect(ids(rubricFor({ criteria: [{ kind: 'bracket' }] }))).toEqual(['moment', 'settings', 'bracket']);
		expect(ids(rubricFor({ criteria: [{ kind: 'focal-max' }, { kind: 'shutter-min' }] }))).toEqual(['moment', 'settings', 'framing']);
	});

	it('uses the author’s list, in the author’s order, when the spec names one', () => {
		expect(ids(rubricFor({ criteria: [{ kind: 'background-cooler' }], rubric: ['light', 'ambient'] }))).toEqual(['light', 'ambient']);
	});

	it('still scores the moment for a kind it has no entry for, and for no spec at all', () => {
		expect(ids(rubricFor({ criteria: [{ kind: 'some-future-kind' }] }))).toEqual(['moment']);
		expect(ids(rubricFor(null))).toEqual(['moment']);
	});

	it('has defaults for every criterion kind the spec knows, naming only catalogue items', () => {
		const known = new Set(RUBRIC_ITEMS.map((i) => i.id));
		for (const kind of CRITERION_KINDS) expect(DEFAULT_RUBRIC_BY_KIND[kind], kind).toBeDefined();
		for (const list of Object.values(DEFAULT_RUBRIC_BY_KIND)) for (const id of list) expect(known.has(id)).toBe(true);
		expect(new Set(known).size).toBe(RUBRIC_ITEMS.length);
	});
});

describe('the spec’s rubric field', () => {
	const base = { frames: ['reference', 'lit'], criteria: [{ kind: 'ambient-under', stops: 1.5 }] };
	it('accepts catalogue ids and refuses unknown or repeated ones, naming where', () => {
		expect(validateSpec({ ...base, rubric: ['ambient', 'moment'] }).ok).toBe(true);
		const unknown = validateSpec({ ...base, rubric: ['ambient', 'vibes'] });
		expect(unknown.ok).toBe(false);
		if (!unknown.ok) expect(unknown.errors[0].path).toBe('rubric[1]');
		const twice = validateSpec({ ...base, rubric: ['moment', 'moment'] });
		expect(twice.ok).toBe(false);
		if (!twice.ok) expect(twice.errors).toEqual([{ path: 'rubric[1]', message: 'lists "moment" twice' }]);
	});
});

describe('cleanRubric', () => {
	it('keeps the assignment’s items with whole scores 1–4, from numbers or form text', () => {
		const items = rubricFor({ criteria: [{ kind: 'ambient-under' }, { kind: 'subject-lift' }] });
		expect(cleanRubric({ ambient: '4', light: 2, balance: '', moment: '5', colour: 3, bogus: 3 }, items)).toEqual({ ambient: 4, light: 2 });
		expect(cleanRubric({ balance: 2.5 }, items)).toEqual({});
	});
});
