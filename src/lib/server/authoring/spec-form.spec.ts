// The spec form is built from the schema: every kind and field the grader accepts appears, in words, with its limits.
import { describe, expect, it } from 'vitest';
import { CRITERION_KINDS, validateSpec } from '../grading/index';
import { CRITERION_WORDS } from './criterion-words';
import { specFormKinds } from './spec-form';

describe('specFormKinds', () => {
	const kinds = specFormKinds();

	it('lists every criterion kind the schema accepts, each with words (add an entry to CRITERION_WORDS for a new kind)', () => {
		expect(kinds.map((k) => k.kind)).toEqual(CRITERION_KINDS);
		for (const k of kinds) {
			expect(CRITERION_WORDS[k.kind], `CRITERION_WORDS has no entry for "${k.kind}"`).toBeDefined();
			for (const f of k.fields) expect(f.label, `${k.kind}.${f.name} has no label`).not.toBe(f.name);
		}
	});

	it('takes fields, required-ness, limits and defaults from the schema', () => {
		const ambient = kinds.find((k) => k.kind === 'ambient-under')!;
		expect(ambient.fields.map((f) => f.name)).toEqual(['stops', 'tolerance', 'sceneEv', 'frame', 'reference']);
		expect(ambient.fields.find((f) => f.name === 'stops')).toMatchObject({ required: true, min: 0, max: 6, unit: 'stops', input: 'number' });
		expect(ambient.fields.find((f) => f.name === 'tolerance')).toMatchObject({ required: false, default: 0.34 });
		expect(ambient.fields.find((f) => f.name === 'reference')).toMatchObject({ input: 'frame', required: false });
		const bracket = kinds.find((k) => k.kind === 'bracket')!;
		expect(bracket.fields.find((f) => f.name === 'offsets')).toMatchObject({ input: 'numbers', required: true });
		expect(bracket.fields.find((f) => f.name === 'frames')).toMatchObject({ input: 'frames' });
		expect(kinds.find((k) => k.kind === 'shutter-min')!.fields[0]).toMatchObject({ name: 'seconds', input: 'seconds', unit: 's' });
	});

	it('starts each new criterion with values that validate in a two-frame spec (a bracket needs one offset per frame)', () => {
		for (const k of kinds) {
			const frames = k.kind === 'bracket' ? ['a', 'b', 'c'] : ['reference', 'lit'];
			const result = validateSpec({ frames, criteria: [k.starter] });
			expect(result.ok ? [] : result.errors, k.kind).toEqual([]);
		}
	});
});
