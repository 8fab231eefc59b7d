import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ExposureInputError } from './errors';
import { freezeShutter, motionBlurPx } from './motion';

const runner = { speed: 5, distance: 10, focalLength: 50, sensorWidth: 36, imageWidth: 6000 };

describe('motionBlurPx', () => {
	it('matches a hand-worked thin-lens example', () => {
		// worked by hand, thin-lens magnification m = f/(d − f): 5 m/s × 1/1000 s = 5 mm of travel;
		// m = 50/(10000 − 50) = 0.0050251; image travel 0.025126 mm; pixel pitch 36/6000 = 0.006 mm → 4.188 px
		expect(motionBlurPx({ ...runner, exposure: 1 / 1000 })).toBeCloseTo(4.1876, 3);
	});

	it('agrees with the field-of-view estimate for distant subjects', () => {
		// far-field geometry: the frame spans d·sensor/f metres, so pixels per metre = imageWidth·f/(d·sensor)
		const far = { speed: 12, distance: 60, focalLength: 24, sensorWidth: 23.5, imageWidth: 6000, exposure: 1 / 500 };
		const spanM = (far.distance * far.sensorWidth) / far.focalLength;
		const estimate = (far.speed * far.exposure * far.imageWidth) / spanM;
		expect(motionBlurPx(far) / estimate).toBeCloseTo(1, 3);
	});

	it('is proportional to speed and exposure', () => {
		fc.assert(
			fc.property(fc.double({ min: 0.1, max: 30, noNaN: true }), fc.double({ min: 1 / 16000, max: 1, noNaN: true }), (speed, t) => {
				const one = motionBlurPx({ ...runner, speed, exposure: t });
				expect(motionBlurPx({ ...runner, speed: 2 * speed, exposure: t }) / one).toBeCloseTo(2, 9);
				expect(motionBlurPx({ ...runner, speed, exposure: t / 4 }) / one).toBeCloseTo(0.25, 9);
			})
		);
	});

	it('is zero for a still subject and refuses impossible geometry', () => {
		expect(motionBlurPx({ ...runner, speed: 0, exposure: 1 })).toBe(0);
		expect(() => motionBlurPx({ ...runner, distance: 0.04, exposure: 1 / 100 })).toThrow(/beyond the focal length/);
		expect(() => motionBlurPx({ ...runner, speed: -1, exposure: 1 / 100 })).toThrow(ExposureInputError);
		expect(() => motionBlurPx({ ...runner, exposure: 0 })).toThrow(ExposureInputError);
	});
});

describe('freezeShutter', () => {
	it('is the exposure that gives exactly the allowed blur', () => {
		// inverse of motionBlurPx (blur is linear in exposure)
		fc.assert(
			fc.property(
				fc.double({ min: 0.1, max: 30, noNaN: true }),
				fc.double({ min: 1, max: 100, noNaN: true }),
				fc.double({ min: 0.5, max: 20, noNaN: true }),
				(speed, distance, maxBlurPx) => {
					const t = freezeShutter({ ...runner, speed, distance, maxBlurPx });
					expect(motionBlurPx({ ...runner, speed, distance, exposure: t })).toBeCloseTo(maxBlurPx, 6);
				}
			)
		);
	});

	it('asks for about 1/1000 s for a 5 m/s runner at 10 m with 50 mm and 4 px of blur', () => {
		// same hand-worked thin-lens example as above
		expect(freezeShutter({ ...runner, maxBlurPx: 4.1876 })).toBeCloseTo(1 / 1000, 6);
	});

	it('allows any time for a still subject', () => {
		expect(freezeShutter({ ...runner, speed: 0, maxBlurPx: 2 })).toBe(Infinity);
		expect(() => freezeShutter({ ...runner, maxBlurPx: 0 })).toThrow(ExposureInputError);
	});
});
