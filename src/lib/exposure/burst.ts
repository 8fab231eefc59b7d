// Flash bursts: the power a frame needs after high-speed sync, how long the flash takes to recycle, and how many frames of a burst it lights.
import { ExposureInputError, requireNonNegative, requirePositive } from './errors';

/** Seconds a flash needs to recharge after a burst at `power` (fraction of full), from its full-power recycle time. */
// common practice, no published source: a flash refills its capacitor with the energy it spent, so recycle time
// scales roughly with the power used (half power, about half the time); real units vary, and fresh batteries help.
export function recycleTime(args: { fullPowerRecycle: number; power: number }): number {
	const full = requireNonNegative('fullPowerRecycle', args?.fullPowerRecycle, 's');
	const power = requirePositive('power', args.power, '(fraction of full power)');
	if (power > 1) throw new ExposureInputError(`power is a fraction of full power (1 = full), got ${power}`);
	return full * power;
}

export interface BurstPlan {
	/** Power the exposure needs at or below sync speed, as a fraction of full power. */
	power: number;
	/** Stops of flash lost to high-speed sync (0 at or below sync; see hssCost). */
	hssStops?: number;
	/** Recycle time at full power, seconds (from the flash's specification or your own test). */
	fullPowerRecycle: number;
	/** Camera frame rate, frames per second. */
	fps: number;
	/** Frames in the burst. */
	frames: number;
}

export interface BurstBudget {
	/** Power the flash must be set to per frame once high-speed sync has taken its share (may exceed 1). */
	powerPerFrame: number;
	/** False when that is more than the flash has: no frame is lit correctly. */
	withinPower: boolean;
	recycle: number;
	/** The flash is ready again on every n-th frame (1 = every frame). */
	everyNth: number;
	/** Frames of the burst the flash lights at full strength. */
	litFrames: number;
	/** Fastest frame rate at which every frame is lit. */
	maxFpsAllLit: number;
}

/** How a burst goes: the power per frame after high-speed sync, the recycle time, and the frames the flash can light. */
export function burstBudget(plan: BurstPlan): BurstBudget {
	if (plan === null || typeof plan !== 'object') throw new ExposureInputError('burst plan must be an object');
	const power = requirePositive('power', plan.power, '(fraction of full power)');
	const hss = requireNonNegative('hssStops', plan.hssStops ?? 0, 'stops');
	const fps = requirePositive('fps', plan.fps, 'frames per second');
	const frames = requirePositive('frames', plan.frames);
	if (!Number.isInteger(frames)) throw new ExposureInputError(`frames must be a whole number, got ${frames}`);
	// each stop of high-speed-sync cost doubles the power the same exposure needs
	const powerPerFrame = power * 2 ** hss;
	const withinPower = powerPerFrame <= 1 + 1e-9;
	if (!withinPower) {
		return { powerPerFrame, withinPower, recycle: Infinity, everyNth: Infinity, litFrames: 0, maxFpsAllLit: 0 };
	}
	const recycle = recycleTime({ fullPowerRecycle: plan.fullPowerRecycle, power: Math.min(1, powerPerFrame) });
	// The flash fires on the first frame, then on the first frame that comes after it has recycled.
	const interval = 1 / fps;
	const everyNth = Math.max(1, Math.ceil(recycle / interval - 1e-9));
	return {
		powerPerFrame,
		withinPower,
		recycle,
		everyNth,
		litFrames: Math.ceil(frames / everyNth),
		maxFpsAllLit: recycle === 0 ? Infinity : 1 / recycle
	};
}
