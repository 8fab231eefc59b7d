// Light Plan layout helpers: presets are independent copies, keys move items in steps, items stay on the plan.
import { describe, expect, it } from 'vitest';
import { clampToPlan, freeSpot, fromSvg, nudge, PLAN_HALF, PLAN_PRESETS, presetLayout, toSvg } from './plan';

describe('plan helpers', () => {
	it('gives a fresh copy of a preset each time', () => {
		const a = presetLayout('cross');
		a.lights[0].x = 99;
		expect(presetLayout('cross').lights[0].x).not.toBe(99);
		for (const p of PLAN_PRESETS) expect(presetLayout(p).lights.length).toBeGreaterThan(0);
	});
	it('moves 0.1 m per arrow key, 0.5 m with Shift, up the page for ArrowUp', () => {
		expect(nudge({ x: 0, y: 0 }, 'ArrowUp', false)).toEqual({ x: 0, y: 0.1 });
		expect(nudge({ x: 0, y: 0 }, 'ArrowLeft', true)).toEqual({ x: -0.5, y: 0 });
		expect(nudge({ x: 0.1, y: 0.2 }, 'ArrowRight', false)).toEqual({ x: 0.2, y: 0.2 });
		expect(nudge({ x: 0, y: 0 }, 'Enter', false)).toBeNull();
	});
	it('keeps items on the plan', () => {
		expect(clampToPlan({ x: 50, y: -50 })).toEqual({ x: PLAN_HALF - 0.2, y: -(PLAN_HALF - 0.2) });
		expect(nudge({ x: PLAN_HALF - 0.2, y: 0 }, 'ArrowRight', true)).toEqual({ x: PLAN_HALF - 0.2, y: 0 });
	});
	it('converts between metres and SVG units both ways, y flipped', () => {
		expect(toSvg({ x: 0, y: 0 })).toEqual({ x: 160, y: 160 });
		expect(toSvg({ x: 0, y: -3 }).y).toBeGreaterThan(160);
		const back = fromSvg(toSvg({ x: 1.25, y: -2.5 }).x, toSvg({ x: 1.25, y: -2.5 }).y);
		expect(back.x).toBeCloseTo(1.25, 10);
		expect(back.y).toBeCloseTo(-2.5, 10);
	});
	it('puts a new light where nothing else stands', () => {
		const layout = presetLayout('rembrandt');
		const spot = freeSpot(layout);
		for (const p of [layout.camera, layout.subject, ...layout.lights]) expect(Math.hypot(p.x - spot.x, p.y - spot.y)).toBeGreaterThanOrEqual(0.6);
	});
});
