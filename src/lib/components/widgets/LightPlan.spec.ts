// Light Plan shows the engine's distances, angles, key pattern and per-light stops for each preset layout.
import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import { angleAtSubject, distance, falloffStops, lightPattern } from '$lib/exposure';
import LightPlan from './LightPlan.svelte';
import { presetLayout, type PlanPreset } from './parts/plan';
import { attrOf, elementsByTestId, textOf } from './parts/ssr-html';
import { formatNumber, formatSigned } from '$lib/format';

const show = (preset: string) => render(LightPlan, { props: { preset } }).body;

/** Checks every shown number of a preset against the engine's answer for the same layout. */
function expectEngineNumbers(body: string, preset: PlanPreset) {
	const { camera, subject, lights } = presetLayout(preset);
	const key = lightPattern({ camera, subject, light: lights[0] });
	expect(textOf(body, 'plan-pattern-angle')).toContain(`${Math.round(key.angleFromFacing)}° from where the subject faces`);
	expect(textOf(body, 'plan-camera-distance')).toBe(`${formatNumber(distance(camera, subject), 2)} m`);
	lights.forEach((light, i) => {
		expect(textOf(body, `plan-light-${i + 1}-distance`)).toBe(`${formatNumber(distance(light, subject), 2)} m`);
		expect(textOf(body, `plan-light-${i + 1}-angle`)).toBe(`${Math.round(angleAtSubject(camera, subject, light))}°`);
		expect(textOf(body, `plan-light-${i + 1}-stops`)).toBe(formatSigned(-falloffStops(distance(lights[0], subject), distance(light, subject))));
	});
	expect(elementsByTestId(body, `plan-light-${lights.length + 1}`)).toHaveLength(0);
	return key;
}

describe('Light Plan', () => {
	it('Rembrandt: key 2 m out at 45°', () => {
		const body = show('rembrandt');
		const key = expectEngineNumbers(body, 'rembrandt');
		expect(key.pattern).toBe('rembrandt');
		expect(textOf(body, 'plan-pattern')).toMatch(/^Rembrandt/);
		expect(textOf(body, 'plan-pattern-angle')).toContain(`on their ${key.side}`);
		// Plane geometry: (−√2, −√2) is √(2 + 2) = 2 m from the subject, 45° off the line to the camera at (0, −3)
		expect(textOf(body, 'plan-light-1-distance')).toBe('2.00 m');
		expect(textOf(body, 'plan-light-1-angle')).toBe('45°');
		expect(textOf(body, 'plan-camera-distance')).toBe('3.00 m');
		expect(textOf(body, 'plan-light-1-stops')).toBe('0.0');
	});

	it('cross light: the back light at twice the distance is two stops down', () => {
		const body = show('cross');
		expectEngineNumbers(body, 'cross');
		// Inverse-square law (the basis of the ISO 1230 guide number, GN = d·N): (2 m / 4 m)² = 1/4 = −2 stops
		expect(textOf(body, 'plan-light-2-distance')).toBe('4.00 m');
		expect(textOf(body, 'plan-light-2-stops')).toBe('\u22122.0');
		// Plane geometry: (−2√2, 2√2) lies 135° from the camera direction (0, −1)
		expect(textOf(body, 'plan-light-2-angle')).toBe('135°');
	});

	it('rim: lights behind the subject read as rim', () => {
		const body = show('rim');
		expect(expectEngineNumbers(body, 'rim').pattern).toBe('rim');
		expect(textOf(body, 'plan-pattern')).toBe('Rim');
		// Plane geometry: (±√3, 1) is 2 m out and 120° from the camera direction (0, −1)
		expect(textOf(body, 'plan-light-1-angle')).toBe('120°');
	});

	it('on-axis: flat front light', () => {
		const body = show('on-axis');
		expect(expectEngineNumbers(body, 'on-axis').pattern).toBe('front');
		expect(textOf(body, 'plan-pattern')).toBe('Flat front light');
	});

	it('makes every item a labelled, focusable control', () => {
		const body = show('cross');
		for (const id of ['plan-camera', 'plan-subject', 'plan-light-1', 'plan-light-2']) {
			expect(attrOf(body, id, 'tabindex')).toBe('0');
			expect(attrOf(body, id, 'role')).toBe('button');
			expect(attrOf(body, id, 'aria-label')).toMatch(/Arrow keys move it/);
		}
		expect(attrOf(body, 'plan-light-1', 'aria-label')).toMatch(/^Light 1 \(key\): 1\.4 m across, \u22121\.4 m up/);
	});

	it('shows a notice and falls back to Rembrandt on an unknown preset', () => {
		const body = show('butterfly');
		expect(textOf(body, 'widget-notice')).toContain('preset="butterfly"');
		expectEngineNumbers(body, 'rembrandt');
	});
});
