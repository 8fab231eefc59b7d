// Ambient Dimmer shows the engine's settings for N stops under a daylight scene, with the shutter held at sync.
import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import { apertureFor, daylightEv, equivalentExposures, ev100, formatAperture, markedSeries, nearestMarked, type DaylightCondition } from '$lib/exposure';
import AmbientDimmer from './AmbientDimmer.svelte';
import { elementsByTestId, listItems, textOf } from './parts/ssr-html';
import { formatNumber } from '$lib/format';

const show = (props: Record<string, string>) => render(AmbientDimmer, { props }).body;

/** The engine's answer: the ⅓-stop aperture at the marked sync speed, and how far under it really lands. */
function expected(scene: DaylightCondition, under: number, syncSeconds: number, iso: number) {
	const sync = nearestMarked(syncSeconds, 'shutter');
	const isoMark = nearestMarked(iso, 'iso');
	const n = nearestMarked(apertureFor({ ev100: daylightEv(scene) + under, shutter: sync.value, iso: isoMark.value }), 'aperture');
	const actual = ev100({ aperture: n.value, shutter: sync.value, iso: isoMark.value }) - daylightEv(scene);
	return { aperture: formatAperture(n.value), shutter: `${sync.label} s`, under: formatNumber(actual, 1), target: daylightEv(scene) + under, iso: isoMark.value, sync };
}

describe('Ambient Dimmer', () => {
	it('puts bright sun two stops under at f/22, 1/250 s, ISO 100', () => {
		const body = show({ scene: 'bright-sun', under: '2', sync: '1/250', iso: '100' });
		const e = expected('bright-sun', 2, 1 / 250, 100);
		expect(textOf(body, 'dimmer-aperture')).toBe(e.aperture);
		expect(textOf(body, 'dimmer-shutter')).toBe(e.shutter);
		expect(textOf(body, 'dimmer-actual-under')).toBe(`${e.under} stops under the meter`);
		// Bright sun is EV100 15 (ANSI PH2.7 daylight table as widely reproduced; from memory). Two under is EV 17;
		// APEX (ASA PH2.5-1960): Tv(1/250) = 8, so Av = 9 and N = 2^4.5 ≈ 22.6, marked f/22.
		expect(textOf(body, 'dimmer-aperture')).toBe('f/22');
		expect(textOf(body, 'dimmer-actual-under')).toBe('2.0 stops under the meter');
		expect(textOf(body, 'dimmer-scene-ev')).toBe('EV 15 · f/11 at 1/250 s');
	});

	it("accepts the lessons' short 'hazy' for hazy sun", () => {
		const body = show({ scene: 'hazy', under: '1', sync: '1/250', iso: '100' });
		expect(elementsByTestId(body, 'widget-notice')).toHaveLength(0);
		expect(textOf(body, 'dimmer-aperture')).toBe(expected('hazy-sun', 1, 1 / 250, 100).aperture);
		// Hazy sun EV100 14 (ANSI PH2.7 as widely reproduced; from memory) + 1 = EV 15; APEX: Av = 15 − 8 = 7 → f/11.3, marked f/11
		expect(textOf(body, 'dimmer-aperture')).toBe('f/11');
	});

	it('follows ISO, sync speed and thirds of a stop as the engine does', () => {
		const body = show({ scene: 'open-shade', under: '1.67', sync: '1/200', iso: '200' });
		const e = expected('open-shade', 5 / 3, 1 / 200, 200);
		expect(textOf(body, 'dimmer-aperture')).toBe(e.aperture);
		expect(textOf(body, 'dimmer-shutter')).toBe('1/200 s');
		expect(textOf(body, 'dimmer-under-value')).toBe('1⅔ stops');
		expect(textOf(body, 'dimmer-actual-under')).toBe(`${e.under} stops under the meter`);
	});

	it('lists only other settings at or below sync that give the same ambient', () => {
		const body = show({ scene: 'overcast', under: '2', sync: '1/250', iso: '100' });
		const e = expected('overcast', 2, 1 / 250, 100);
		const fullStops = markedSeries('aperture', 1).filter((m) => m.value > 2.7 && m.value < 23).map((m) => m.value);
		const rows = equivalentExposures(e.target, { iso: e.iso, apertures: fullStops, shutterRange: { min: e.sync.value, max: 1 / 15 } });
		expect(listItems(body, 'dimmer-others')).toEqual(rows.map((r) => `${r.apertureLabel} · ${r.shutterLabel}`));
		// Overcast EV100 13 + 2 = EV 15; APEX: f/11 (Av 7) at 1/250 s (Tv 8) and f/16 (Av 8) at 1/125 s (Tv 7)
		expect(listItems(body, 'dimmer-others')).toEqual(expect.arrayContaining(['f/11 · 1/250', 'f/16 · 1/125']));
		expect(listItems(body, 'dimmer-others')).not.toContain('f/8 · 1/500');
	});

	it('warns when the answer needs an aperture smaller than f/22', () => {
		const body = show({ scene: 'bright-sun', under: '3', sync: '1/250', iso: '100' });
		// APEX: EV 18 at Tv 8 needs Av 10, N = 32
		expect(textOf(body, 'dimmer-warning')).toContain('f/32');
		expect(elementsByTestId(show({ scene: 'bright-sun', under: '1', sync: '1/250', iso: '100' }), 'dimmer-warning')).toHaveLength(0);
	});

	it('shows a notice and falls back instead of throwing on bad attributes', () => {
		const body = show({ scene: 'fog', under: 'lots', sync: '1/8000', iso: 'auto' });
		const notice = textOf(body, 'widget-notice');
		for (const bit of ['scene="fog"', 'under="lots"', 'sync="1/8000"', 'iso="auto"']) expect(notice).toContain(bit);
		expect(textOf(body, 'dimmer-aperture')).toBe('f/22');
	});
});
