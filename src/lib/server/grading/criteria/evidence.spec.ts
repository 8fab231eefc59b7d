// The subject level predicted from what the learner used, shown beside the measured one.
import { describe, expect, it } from 'vitest';
import { readFrame } from '../../analysis/index';
import { makeFrame, REFERENCE_EXIF } from '../../analysis/test-frames';
import { grade } from '../grade';

const SPEC = { frames: ['reference', 'lit'], criteria: [{ kind: 'subject-lift' as const, minStops: 1 }] };

/** The reference at its meter, and a lit frame 2 stops faster (`litTime` = reference time / 4) relit by the flash. */
async function pair(refTime = 1 / 60) {
	const reference = await readFrame(await makeFrame({ width: 300, height: 200, exif: { ...REFERENCE_EXIF, exposureTime: refTime }, subject: { stops: 0 }, background: { stops: 0 } }));
	const lit = await readFrame(
		await makeFrame({ width: 300, height: 200, exif: { ...REFERENCE_EXIF, exposureTime: refTime / 4, flash: 0x19 }, subject: { stops: 0.8 }, background: { stops: -2 } })
	);
	return { reference, lit };
}
const USED = { gn: 60, power: 0.25, distance: 3 };

describe('predicted subject level', () => {
	it('follows the guide number, power and distance the learner gave', async () => {
		// 1/60 s and 1/240 s at f/8, ISO 100: within the default 1/250 s sync
		const frames = await pair();
		const result = grade(SPEC, frames, { used: USED });
		const lift = result.criteria[0];
		// Hand-worked: the guide number is distance × f-number at ISO 100 (ISO 1230). ¼ power is half the guide number,
		// 30; at 3 m it asks for f/10, and f/8 takes 2·log2(10/8) = 0.644 stop more. The ambient sits 2 stops under, so
		// the subject gets 2^−2 + 2^0.644 = 1.8125 of a correct exposure: log2(1.8125) + 2 = 2.858 stops over the ambient.
		expect(lift.evidence?.predictedLift).toBeCloseTo(2.858, 2);
		// measured beside it: the pixels' own lift (0.8 − (−2) = 2.8 stops in these flat test frames)
		expect(lift.evidence?.lift).toBeCloseTo(2.8, 0);
	});

	it('costs the flash at least the shutter’s own stops above sync (high-speed sync)', async () => {
		const atSync = grade(SPEC, await pair(), { used: USED }).criteria[0].evidence!.predictedLift!;
		// 1/500 s and 1/2000 s: the pulsed flash lights 1/2000 s of a 1/250 s burst, log2(2000/250) = 3 stops less
		const above = grade(SPEC, await pair(1 / 500), { used: USED }).criteria[0].evidence!.predictedLift!;
		const flashAtSync = Math.log2(2 ** atSync * 2 ** -2 - 2 ** -2);
		const flashAbove = Math.log2(2 ** above * 2 ** -2 - 2 ** -2);
		expect(flashAtSync - flashAbove).toBeGreaterThanOrEqual(3);
	});

	it('is left out when the guide number or the distance is missing', async () => {
		const frames = await pair();
		expect(grade(SPEC, frames, { used: { power: 0.25, distance: 3 } }).criteria[0].evidence?.predictedLift).toBeUndefined();
		expect(grade(SPEC, frames).criteria[0].evidence?.predictedLift).toBeUndefined();
	});
});
