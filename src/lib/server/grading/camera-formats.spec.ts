// A phone's HEIC pair and a raw (DNG) pair graded end to end: decoded, Exif read, pixels measured, the flash's lift found.
import { describe, expect, it } from 'vitest';
import { readFrame, type Frame } from '../analysis/index';
import { makeDng } from '../analysis/test-dng';
import { makeHeic } from '../analysis/test-heic';
import { REFERENCE_EXIF, type TestExif, type TestFrameSpec } from '../analysis/test-frames';
import { grade } from './grade';
import type { AssignmentSpecInput } from './spec';

const SPEC: AssignmentSpecInput = {
	frames: ['reference', 'lit'],
	criteria: [
		{ kind: 'ambient-under', stops: 2, tolerance: 0.34 },
		{ kind: 'subject-lift', minStops: 1 },
		{ kind: 'flash-evidence' }
	]
};

const FLASH_FIRED = 0x19; // CIPA DC-008: fired, auto mode
type Maker = (spec: TestFrameSpec) => Promise<Buffer>;

// The reference at 1/500 s; the lit frame 2 stops shorter (1/2000 s): the background falls 2 stops with the settings,
// while flash holds the subject at mid-grey, a lift of log2(1 / 2^−2) = 2 stops above the ambient alone (hand-worked,
// as in grade.spec.ts; shutter stops by APEX, ASA PH2.5-1960: log2(2000/500) = 2).
async function pair(make: Maker): Promise<{ reference: Frame; lit: Frame }> {
	const shot = async (exif: TestExif, background: number) => readFrame(await make({ width: 320, height: 240, exif, subject: { stops: 0 }, background: { stops: background } }));
	return {
		reference: await shot({ ...REFERENCE_EXIF }, 0.5),
		lit: await shot({ ...REFERENCE_EXIF, exposureTime: 1 / 2000, flash: FLASH_FIRED }, -1.5)
	};
}

const FORMATS: [string, Maker, string][] = [
	['HEIC (made by heif-enc, decoded by libheif in WebAssembly)', makeHeic, 'HEIC'],
	['DNG (written by hand, decoded by LibRaw to linear data)', async (spec) => makeDng(spec), 'raw (DNG)'],
	['DNG with Bayer data (14-bit, black level 512, the camera white balance undone by LibRaw)', async (spec) => makeDng({ ...spec, cfa: true }), 'raw (DNG)']
];

describe.each(FORMATS)('a %s pair', (_, make, label) => {
	it('is graded with pixels measured and Exif read: 2 stops under, a 2-stop lift, the flash recorded', async () => {
		const frames = await pair(make);
		for (const frame of Object.values(frames)) {
			expect(frame.file.label).toBe(label);
			expect(frame.pixels).not.toBeNull();
			expect(frame.exif).toMatchObject({ fNumber: 8, iso: 100, make: 'Stopwise Test' });
		}
		expect(frames.lit.exif.exposureTime).toBeCloseTo(1 / 2000, 8);
		expect(frames.reference.pixels!.subject.stops).toBeCloseTo(0, 1);
		expect(frames.lit.pixels!.background.stops).toBeCloseTo(-1.5, 1);

		const result = grade(SPEC, frames);
		const byKind = (kind: string) => result.criteria.find((c) => c.kind === kind)!;
		expect(byKind('ambient-under').measured as number).toBeCloseTo(2, 2);
		const lift = byKind('subject-lift');
		expect(lift.verdict).toBe('pass');
		// within 0.1 stop of the 2 stops the scene was made with
		expect(Math.abs((lift.measured as number) - 2)).toBeLessThan(0.1);
		expect(byKind('flash-evidence').verdict).toBe('pass');
		expect(result.verdict).toBe('pass');
	});
});
