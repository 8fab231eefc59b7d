// motion-blur: blur in pixels from the graded frame's Exif shutter and 35 mm focal length against a stated subject speed.
import { describe, expect, it } from 'vitest';
import { motionBlurPx } from '../../../exposure/index';
import { readFrame, type Frame } from '../../analysis/index';
import { makeFrame, REFERENCE_EXIF, type TestExif } from '../../analysis/test-frames';
import { grade } from '../grade';
import type { AssignmentSpecInput } from '../spec';

async function frame(exif: Partial<TestExif>, size = { width: 300, height: 200 }): Promise<Frame> {
	return readFrame(await makeFrame({ ...size, exif: { ...REFERENCE_EXIF, ...exif }, subject: { stops: 0 }, background: { stops: 0 } }));
}

const spec = (criterion: Record<string, unknown>): AssignmentSpecInput =>
	({ frames: ['frozen'], criteria: [{ kind: 'motion-blur', maxPx: 2, speed: 6, distance: 5, ...criterion }] }) as AssignmentSpecInput;
const only = async (criterion: Record<string, unknown>, f: Frame) => grade(spec(criterion), { frozen: f }).criteria[0];

describe('motion-blur criterion', () => {
	it('counts blur with the thin-lens magnification f / (d − f) on the 36 mm long side of a 35 mm equivalent frame', async () => {
		const result = await only({}, await frame({ exposureTime: 1 / 30, focal35: 24 }));
		// thin lens (any optics text, e.g. Hecht, Optics, 5th ed., §5.2): m = 24 / (5000 − 24); 6 m/s for 1/30 s is 200 mm
		// on the subject → 200 × m mm on a 36 mm wide frame of 300 px
		const byHand = ((6000 / 30) * (24 / (5000 - 24)) * 300) / 36;
		expect(result.measured as number).toBeCloseTo(byHand, 6);
		expect(result.measured).toBeCloseTo(
			motionBlurPx({ speed: 6, distance: 5, focalLength: 24, sensorWidth: 36, imageWidth: 300, exposure: 1 / 30 }),
			9
		);
		expect(result.verdict).toBe('fail');
		expect(result.unit).toBe('px');
		expect(result.message).toMatch(/1\/30 s/);
		// the slowest marked shutter that keeps 2 px: 2 / (241.2 px/s) = 1/121 s → the next marked time at or under it, 1/125 s
		expect(result.message).toMatch(/1\/125 s or shorter/);
	});

	it('passes a short shutter, and says so in numbers', async () => {
		const result = await only({}, await frame({ exposureTime: 1 / 1000, focal35: 24 }));
		expect(result.verdict).toBe('pass');
		expect(result.measured as number).toBeCloseTo(((6000 / 1000) * (24 / 4976) * 300) / 36, 6);
		expect(result.message).toMatch(/6 m\/s/);
	});

	it('uses the long side of a portrait frame', async () => {
		const portrait = await only({}, await frame({ exposureTime: 1 / 30, focal35: 24 }, { width: 200, height: 300 }));
		const landscape = await only({}, await frame({ exposureTime: 1 / 30, focal35: 24 }));
		expect(portrait.measured).toBeCloseTo(landscape.measured as number, 9);
	});

	it('matches the lesson 12 example: 6 m/s, 5 m, 24 mm, 6000 px, 1/1000 s is about 4.8 px', () => {
		// the lesson's hand calculation uses m ≈ f / d; the thin-lens value is a little larger
		const px = motionBlurPx({ speed: 6, distance: 5, focalLength: 24, sensorWidth: 36, imageWidth: 6000, exposure: 1 / 1000 });
		expect(px).toBeGreaterThan(4.8);
		expect(px).toBeLessThan(4.85);
	});

	it('names the missing Exif tag and hands the frame to a mentor', async () => {
		const result = await only({}, await frame({ exposureTime: 1 / 1000, focal35: undefined }));
		expect(result.verdict).toBe('unknown');
		expect(result.missing).toEqual(['FocalLengthIn35mmFilm']);
	});

	it("says when the speed is the learner's own", async () => {
		const result = await only({ speed: 3, stated: true }, await frame({ exposureTime: 1 / 1000, focal35: 24 }));
		expect(result.message).toMatch(/the 3 m\/s you gave/);
	});
});

describe('mentor-judged criterion', () => {
	it('hands the frame to a mentor with what to look for, naming the Light Plan when the spec asks for one', async () => {
		const f = await frame({});
		const withPlan = grade(
			{ frames: ['frozen'], lightPlan: { minLights: 1 }, criteria: [{ kind: 'mentor-judged', look: 'a triangle of light under the far eye.' }] },
			{ frozen: f }
		);
		expect(withPlan.verdict).toBe('needs-review');
		expect(withPlan.criteria[0]).toMatchObject({ verdict: 'unknown', measured: null, unit: 'judged' });
		expect(withPlan.criteria[0].message).toBe('A mentor judges this from the picture and the Light Plan you attached: a triangle of light under the far eye.');
		const plain = grade({ frames: ['frozen'], criteria: [{ kind: 'mentor-judged', look: 'the pose.' }] }, { frozen: f });
		expect(plain.criteria[0].message).toBe('A mentor judges this from the picture: the pose.');
	});

	it('says when the frame is missing', () => {
		const result = grade({ frames: ['frozen'], criteria: [{ kind: 'mentor-judged', look: 'the pose.' }] }, {});
		expect(result.criteria[0].message).toMatch(/missing from this Attempt/);
	});
});
