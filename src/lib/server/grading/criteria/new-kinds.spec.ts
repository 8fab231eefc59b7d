import { describe, expect, it } from 'vitest';
import { mix } from '../../../exposure/index';
import { readFrame, type Frame } from '../../analysis/index';
import { makeFrame, REFERENCE_EXIF, type TestExif, type TestFrameSpec } from '../../analysis/test-frames';
import { grade } from '../grade';
import { validateSpec, type AssignmentSpecInput } from '../spec';
import { judgeRange, targetRatio } from './flash-share';

const FLASH_FIRED = 0x19; // CIPA DC-008: fired, auto mode

// the background spans 3 stops, as a real one does: a single flat level cannot tell a tone curve from an exposure change
async function frame(exif: TestExif, levels: Pick<TestFrameSpec, 'subject' | 'background'>): Promise<Frame> {
	return readFrame(await makeFrame({ width: 300, height: 200, exif, backgroundRamp: 3, ...levels }));
}

describe('sync', () => {
	const spec = (criterion: Record<string, unknown>, extra: Record<string, unknown> = {}) =>
		({ frames: ['lit'], ...extra, criteria: [{ kind: 'sync', ...criterion }] }) as AssignmentSpecInput;

	it('passes at sync, fails above it and states the high-speed-sync cost and the aperture that keeps the ambient', async () => {
		const at = await frame({ ...REFERENCE_EXIF, exposureTime: 1 / 250 }, { subject: { stops: 0 }, background: { stops: 0 } });
		expect(grade(spec({}), { lit: at }).criteria[0].verdict).toBe('pass');
		const above = await frame({ ...REFERENCE_EXIF, exposureTime: 1 / 1000, fNumber: 4 }, { subject: { stops: 0 }, background: { stops: 0 } });
		const result = grade(spec({}), { lit: above }).criteria[0];
		expect(result.verdict).toBe('fail');
		// hssCost: 1 stop to enter + log2((1/250)/(1/1000)) = 2 → 3 stops (common practice, no published source)
		expect(result.message).toContain('loses about 3 stops');
		// the same EV at 1/250 s: two stops less light from the aperture, f/4 → f/8 (APEX, ASA PH2.5-1960)
		expect(result.message).toContain('close down to about f/8');
	});

	it('passes above sync when the assignment is high-speed sync, and honours the spec’s own sync speed', async () => {
		const above = await frame({ ...REFERENCE_EXIF, exposureTime: 1 / 1000 }, { subject: { stops: 0 }, background: { stops: 0 } });
		const hss = grade(spec({ highSpeedSync: true }), { lit: above }).criteria[0];
		expect(hss.verdict).toBe('pass');
		expect(hss.message).toMatch(/high-speed sync/);
		const fast = await frame({ ...REFERENCE_EXIF, exposureTime: 1 / 320 }, { subject: { stops: 0 }, background: { stops: 0 } });
		expect(grade(spec({}), { lit: fast }).criteria[0].verdict).toBe('fail');
		expect(grade(spec({}, { syncSpeed: 1 / 320 }), { lit: fast }).criteria[0].verdict).toBe('pass');
	});
});

describe('flash-share', () => {
	it('needs exactly one of share and ratioStops', () => {
		expect(validateSpec({ frames: ['reference', 'lit'], criteria: [{ kind: 'flash-share' }] }).ok).toBe(false);
		expect(validateSpec({ frames: ['reference', 'lit'], criteria: [{ kind: 'flash-share', share: 0.5, ratioStops: 0 }] }).ok).toBe(false);
		expect(validateSpec({ frames: ['reference', 'lit'], criteria: [{ kind: 'flash-share', share: 0.5 }] }).ok).toBe(true);
	});

	it('turns a share into a flash:ambient ratio: half and half is 0 stops, three quarters is +log2(3)', () => {
		// s / (1 − s): 0.5 → 1:1, 0.75 → 3:1 (hand-worked)
		expect(targetRatio({ kind: 'flash-share', share: 0.5, tolerance: 0.5 })).toBeCloseTo(0, 12);
		expect(targetRatio({ kind: 'flash-share', share: 0.75, tolerance: 0.5 })).toBeCloseTo(Math.log2(3), 12);
	});

	it('measures the share from the pair and is unknown without a reference frame', async () => {
		const ref = await frame({ ...REFERENCE_EXIF }, { subject: { stops: 0 }, background: { stops: 0.5 } });
		// ambient 2 stops down, subject back at mid-grey: flash 3 parts, ambient 1 (hand-worked: 1 − 2^−2 = 0.75)
		const lit = await frame({ ...REFERENCE_EXIF, exposureTime: 1 / 2000, flash: FLASH_FIRED }, { subject: { stops: 0 }, background: { stops: -1.5 } });
		const spec = (share: number): AssignmentSpecInput => ({ frames: ['reference', 'lit'], criteria: [{ kind: 'flash-share', share, tolerance: 0.5 }] });
		const good = grade(spec(0.75), { reference: ref, lit }).criteria[0];
		expect(good.verdict).toBe('pass');
		expect(good.measured as number).toBeCloseTo(Math.log2(3), 1);
		// the engine's mix puts a 3:1 flash:ambient ratio back at the measured 2-stop lift
		expect(mix({ ambientStops: 0, flashStops: good.measured as number })).toBeCloseTo(2, 1);
		expect(grade(spec(0.25), { reference: ref, lit }).criteria[0].verdict).toBe('fail');
		const single = grade({ frames: ['lit'], criteria: [{ kind: 'flash-share', share: 0.75 }] }, { lit });
		expect(single.criteria[0].verdict).toBe('unknown');
		expect(single.criteria[0].message).toMatch(/reference frame/);
	});
});

describe('flash-share with a weak flash', () => {
	it('states only the most the flash can have given when the ratio is too steep to measure, and fails it', async () => {
		const ref = await frame({ ...REFERENCE_EXIF }, { subject: { stops: 0 }, background: { stops: 0.5 } });
		// ambient 2 stops down; the flash adds an eighth of the ambient on the subject: a lift of log2(1 + 1/8) = 0.17
		// stop, a ratio of −3 stops (hand-worked), which a tenth of a stop of lift error would move by most of a stop
		const lit = await frame({ ...REFERENCE_EXIF, exposureTime: 1 / 2000, flash: FLASH_FIRED }, { subject: { stops: -2 + Math.log2(1.125) }, background: { stops: -1.5 } });
		const r = grade({ frames: ['reference', 'lit'], criteria: [{ kind: 'flash-share', share: 0.75, tolerance: 0.5 }] }, { reference: ref, lit }).criteria[0];
		expect(r.verdict).toBe('fail');
		expect(r.evidence?.upperBound).toBe(true);
		// the bound holds the true ratio and lies below the asked window, log2(3) − ½ (hand-worked)
		expect(r.measured as number).toBeGreaterThanOrEqual(-3);
		expect(r.measured as number).toBeLessThan(Math.log2(3) - 0.5);
		expect(r.message).toMatch(/at most \d+ % of the light/);
	});

	it('judges a range against the window: inside passes, outside fails, across is for a mentor', () => {
		const window = { low: 1, high: 2 };
		expect(judgeRange(1.2, 1.8, window)).toBe('pass');
		expect(judgeRange(-Infinity, 0.5, window)).toBe('fail');
		expect(judgeRange(2.1, Infinity, window)).toBe('fail');
		expect(judgeRange(0.5, 1.5, window)).toBe('unknown');
		expect(judgeRange(-Infinity, Infinity, window)).toBe('unknown');
	});
});

describe('subject-clipping', () => {
	it('fails a subject the flash blew out and notes it on the verdict', async () => {
		const ref = await frame({ ...REFERENCE_EXIF }, { subject: { stops: 0 }, background: { stops: 0.5 } });
		const blown = await frame({ ...REFERENCE_EXIF, exposureTime: 1 / 2000, flash: FLASH_FIRED }, { subject: { stops: 3 }, background: { stops: -1.5 } });
		const result = grade({ frames: ['reference', 'lit'], criteria: [{ kind: 'subject-clipping' }] }, { reference: ref, lit: blown });
		expect(result.criteria[0].verdict).toBe('fail');
		expect(result.criteria[0].measured as number).toBeGreaterThan(90);
		expect(result.notes.join(' ')).toMatch(/blown out/);
		const fine = await frame({ ...REFERENCE_EXIF, exposureTime: 1 / 2000, flash: FLASH_FIRED }, { subject: { stops: 0 }, background: { stops: -1.5 } });
		const ok = grade({ frames: ['reference', 'lit'], criteria: [{ kind: 'subject-clipping' }] }, { reference: ref, lit: fine });
		expect(ok.criteria[0].verdict).toBe('pass');
		expect(ok.notes).toEqual([]);
	});
});
