import { describe, expect, it } from 'vitest';
import { CRITERION_KINDS, parseSpecText, resolveFrames, validateSpec } from './spec';
import { formatPath, formatSpecErrors } from './spec-errors';

const EXAMPLE = {
	frames: ['reference', 'lit'],
	criteria: [
		{ kind: 'ambient-under', stops: 2, tolerance: 0.34 },
		{ kind: 'subject-lift', minStops: 1 },
		{ kind: 'background-drop', tolerance: 0.5 },
		{ kind: 'shutter-min', seconds: 0.001 },
		{ kind: 'flash-evidence' },
		{ kind: 'background-cooler', minMired: 60 },
		{ kind: 'focal-max', mm35: 35 }
	]
};

function errorsOf(input: unknown) {
	const r = validateSpec(input);
	if (r.ok) throw new Error('expected the spec to be refused');
	return r.errors;
}

describe('validateSpec', () => {
	it('accepts the example Assignment and fills in defaults', () => {
		const r = validateSpec(EXAMPLE);
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		expect(r.spec.criteria[4]).toEqual({ kind: 'flash-evidence', minLiftStops: 0.5 });
		expect(validateSpec({ frames: ['a', 'b'], criteria: [{ kind: 'ambient-under', stops: 1 }] })).toMatchObject({
			ok: true,
			spec: { criteria: [{ tolerance: 0.34 }] }
		});
	});

	it('knows every criterion kind the issue lists', () => {
		expect([...CRITERION_KINDS].sort()).toEqual(
			['ambient-under', 'aperture-range', 'background-cooler', 'background-drop', 'bracket', 'flash-evidence', 'focal-max', 'focal-min', 'iso-max', 'shutter-max', 'shutter-min', 'subject-lift', 'sync', 'flash-share', 'subject-clipping', 'motion-blur', 'mentor-judged'].sort()
		);
	});

	it('locates each error by path, in words for an author', () => {
		const errors = errorsOf({
			frames: ['reference', 'lit'],
			criteria: [{ kind: 'ambient-under', stops: 'two' }, { kind: 'shutter-min' }, { kind: 'sparkle' }, { kind: 'iso-max', iso: -100 }]
		});
		expect(errors).toEqual(
			expect.arrayContaining([
				{ path: 'criteria[0].stops', message: 'must be a number' },
				{ path: 'criteria[1].seconds', message: 'is required' },
				{ path: 'criteria[2].kind', message: expect.stringContaining('must be one of: ambient-under') },
				{ path: 'criteria[3].iso', message: 'must be more than 0' }
			])
		);
		expect(formatSpecErrors(errors)).toContain('criteria[1].seconds is required');
	});

	it('refuses unknown fields, duplicate frames and references to frames that are not listed', () => {
		const errors = errorsOf({
			frames: ['lit', 'lit'],
			criteria: [{ kind: 'subject-lift', minStops: 1, frame: 'other', colour: 'red' }]
		});
		const paths = errors.map((e) => e.path);
		expect(paths).toContain('criteria[0]');
		expect(errors.find((e) => e.path === 'criteria[0]')?.message).toMatch(/colour/);
		expect(errors.find((e) => e.path === 'frames[1]')?.message).toMatch(/twice/);
	});

	it('checks what each criterion needs from the frames', () => {
		expect(errorsOf({ frames: ['lit'], criteria: [{ kind: 'ambient-under', stops: 2 }] })[0]).toEqual({
			path: 'criteria[0]',
			message: 'needs an ambient reference frame, or a sceneEv to compare with'
		});
		expect(validateSpec({ frames: ['lit'], sceneEv: 15, criteria: [{ kind: 'ambient-under', stops: 2 }] }).ok).toBe(true);
		expect(errorsOf({ frames: ['lit'], criteria: [{ kind: 'background-drop' }] })[0].message).toMatch(/reference/);
		expect(errorsOf({ frames: ['a', 'b', 'c'], criteria: [{ kind: 'bracket', offsets: [0, 1] }] })[0]).toMatchObject({ path: 'criteria[0].offsets' });
		expect(errorsOf({ frames: ['a', 'b'], criteria: [{ kind: 'bracket', offsets: [1, 0] }] })[0]).toMatchObject({ path: 'criteria[0].offsets[0]' });
		expect(errorsOf({ frames: ['a'], criteria: [{ kind: 'aperture-range', min: 11, max: 4 }] })[0]).toMatchObject({ path: 'criteria[0].min' });
		expect(errorsOf({ frames: ['a'], criteria: [{ kind: 'aperture-range' }] })[0]).toMatchObject({ path: 'criteria[0]' });
	});

	it('refuses what is not a spec at all', () => {
		expect(errorsOf(null)).toEqual([{ path: '', message: 'must be an object' }]);
		expect(errorsOf({ frames: [], criteria: [] }).map((e) => e.path)).toEqual(['frames', 'criteria']);
	});
});

describe('parseSpecText', () => {
	it('reports JSON syntax errors as a spec error', () => {
		const r = parseSpecText('{ "frames": ["lit"], ');
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.errors[0].message).toMatch(/^is not valid JSON/);
	});

	it('parses and validates good text', () => {
		expect(parseSpecText(JSON.stringify(EXAMPLE)).ok).toBe(true);
	});
});

describe('resolveFrames', () => {
	it('grades the last frame against the first unless told otherwise', () => {
		const spec = { frames: ['reference', 'lit'] };
		expect(resolveFrames({ kind: 'subject-lift', minStops: 1 }, spec)).toEqual({ frame: 'lit', reference: 'reference' });
		expect(resolveFrames({ kind: 'background-drop', tolerance: 0.5, frame: 'reference', reference: 'lit' }, spec)).toEqual({ frame: 'reference', reference: 'lit' });
		expect(resolveFrames({ kind: 'subject-lift', minStops: 1 }, { frames: ['lit'] })).toEqual({ frame: 'lit', reference: null });
	});
});

describe('formatPath', () => {
	it('writes paths as an author reads them', () => {
		expect(formatPath(['criteria', 2, 'stops'])).toBe('criteria[2].stops');
		expect(formatPath([])).toBe('');
	});
});
