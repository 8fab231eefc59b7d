// Burst budget: recycle time scaled by power, high-speed-sync cost as power, and the frames of a burst the flash lights.
import { describe, expect, it } from 'vitest';
import { ExposureInputError } from './errors';
import { burstBudget, recycleTime } from './burst';
import { hssCost } from './flash';

describe('recycle time', () => {
	it('scales with the power used', () => {
		// common practice, no published source: recycle time roughly proportional to the energy spent
		expect(recycleTime({ fullPowerRecycle: 2, power: 1 })).toBe(2);
		expect(recycleTime({ fullPowerRecycle: 2, power: 1 / 4 })).toBe(0.5);
		expect(recycleTime({ fullPowerRecycle: 2, power: 1 / 8 })).toBe(0.25);
	});

	it('refuses a power above full or a negative recycle time', () => {
		expect(() => recycleTime({ fullPowerRecycle: 2, power: 2 })).toThrow(ExposureInputError);
		expect(() => recycleTime({ fullPowerRecycle: -1, power: 0.5 })).toThrow(ExposureInputError);
	});
});

describe('burst budget', () => {
	it('lights every third frame of a 10 fps burst at 1/8 power with a 2 s full-power recycle (lesson example)', () => {
		// 0.25 s recycle against 0.1 s between frames: ready again on the third frame; frames 1, 4, 7, 10 of ten
		const b = burstBudget({ power: 1 / 8, fullPowerRecycle: 2, fps: 10, frames: 10 });
		expect(b).toMatchObject({ powerPerFrame: 1 / 8, withinPower: true, recycle: 0.25, everyNth: 3, litFrames: 4 });
		expect(b.maxFpsAllLit).toBe(4);
	});

	it('high-speed sync turns its cost in stops into power: 3 stops at 1/8 needs full power, and one lit frame', () => {
		// common practice, no published source: 1 stop to enter HSS + 2 stops from 1/250 to 1/1000 s
		const cost = hssCost({ shutter: 1 / 1000, syncSpeed: 1 / 250 });
		expect(cost).toBe(3);
		const b = burstBudget({ power: 1 / 8, hssStops: cost, fullPowerRecycle: 2, fps: 10, frames: 10 });
		expect(b).toMatchObject({ powerPerFrame: 1, withinPower: true, recycle: 2, everyNth: 20, litFrames: 1 });
	});

	it('says when even full power is not enough', () => {
		const b = burstBudget({ power: 1 / 4, hssStops: 3, fullPowerRecycle: 2, fps: 10, frames: 10 });
		expect(b.withinPower).toBe(false);
		expect(b.powerPerFrame).toBe(2);
		expect(b.litFrames).toBe(0);
	});

	it('lights every frame when the flash recycles between frames, counting an exact fit as ready', () => {
		expect(burstBudget({ power: 1 / 32, fullPowerRecycle: 2, fps: 10, frames: 12 })).toMatchObject({ everyNth: 1, litFrames: 12 });
		// 1/16 power recycles in 0.125 s; 8 fps leaves exactly 0.125 s between frames
		expect(burstBudget({ power: 1 / 16, fullPowerRecycle: 2, fps: 8, frames: 8 })).toMatchObject({ everyNth: 1, litFrames: 8 });
	});

	it('refuses nonsense with a plain message', () => {
		expect(() => burstBudget({ power: 0, fullPowerRecycle: 2, fps: 10, frames: 10 })).toThrow(/power/);
		expect(() => burstBudget({ power: 1 / 8, fullPowerRecycle: 2, fps: 0, frames: 10 })).toThrow(/fps/);
		expect(() => burstBudget({ power: 1 / 8, fullPowerRecycle: 2, fps: 10, frames: 2.5 })).toThrow(/whole number/);
		expect(() => burstBudget({ power: 1 / 8, hssStops: -1, fullPowerRecycle: 2, fps: 10, frames: 10 })).toThrow(/hssStops/);
	});
});
