// Stop Ladder renders EV100 and its equivalent rungs as the exposure engine computes them.
import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import { equivalentExposures, ev100, markedSeries } from '$lib/exposure';
import StopLadder from './StopLadder.svelte';
import { elementsByTestId, listItems, textOf } from './parts/ssr-html';
import { formatNumber } from '$lib/format';

const show = (props: Record<string, string>) => render(StopLadder, { props }).body;

describe('Stop Ladder', () => {
	it('shows EV 14.0 for f/8, 1/250 s, ISO 100', () => {
		const body = show({ aperture: '8', shutter: '1/250', iso: '100' });
		// APEX, ASA PH2.5-1960: Ev = Av + Tv; f/8 → Av 6, 1/250 → Tv 8 (the mark stands for 2^-8 s), so EV 14
		expect(textOf(body, 'ev100')).toBe('EV 14.0');
		expect(textOf(body, 'aperture-value')).toBe('f/8');
		expect(textOf(body, 'shutter-value')).toBe('1/250 s');
		expect(textOf(body, 'iso-value')).toBe('100');
	});

	it('refers other ISO speeds back to ISO 100, as the engine does', () => {
		const body = show({ aperture: 'f/5.6', shutter: '1/60', iso: '400' });
		const engine = ev100({ aperture: 2 ** 2.5, shutter: 2 ** -6, iso: 100 * 2 ** 2 });
		expect(textOf(body, 'ev100')).toBe(`EV ${formatNumber(engine, 1)}`);
		// APEX, ASA PH2.5-1960: f/5.6 → Av 5, 1/60 → Tv 6 (marked 2^-6 s); ISO 400 is Sv two stops above ISO 100 → EV100 9
		expect(textOf(body, 'ev100')).toBe('EV 9.0');
	});

	it('lists the full-stop rungs of the same exposure from the engine', () => {
		const body = show({ aperture: '8', shutter: '1/250', iso: '100' });
		const apertures = markedSeries('aperture', 1).filter((m) => m.value > 1.9 && m.value < 23).map((m) => m.value);
		const rows = equivalentExposures(14, { iso: 100, apertures, shutterRange: { min: 1 / 8000, max: 2 } });
		const items = listItems(body, 'ladder-rungs');
		expect(items).toEqual(rows.map((r) => `${r.apertureLabel} · ${r.shutterLabel}`));
		// APEX, ASA PH2.5-1960: f/4 (Av 4) at 1/1000 s (Tv 10) is also EV 14; f/16 (Av 8) at 1/60 s (Tv 6) too
		expect(items).toContain('f/4 · 1/1000');
		expect(items).toContain('f/16 · 1/60');
	});

	it('shows a notice and falls back instead of throwing on bad attributes', () => {
		const body = show({ aperture: 'wide open', shutter: 'fast', iso: '-5' });
		const notice = textOf(body, 'widget-notice');
		expect(notice).toContain('aperture="wide open"');
		expect(notice).toContain('shutter="fast"');
		expect(notice).toContain('iso="-5"');
		expect(textOf(body, 'ev100')).toBe('EV 14.0');
	});

	it('shows no notice when the attributes are fine', () => {
		expect(elementsByTestId(show({ aperture: '11', shutter: '1/125', iso: '200' }), 'widget-notice')).toHaveLength(0);
	});
});
