// Sync Gate shows the engine's high-speed-sync cost, the lost reach and the ambient change for a shutter against sync.
import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import { hssCost, nearestMarked } from '$lib/exposure';
import SyncGate from './SyncGate.svelte';
import { attrOf, textOf } from './parts/ssr-html';
import { formatNumber, formatSigned } from '$lib/format';

const show = (props: Record<string, string>) => render(SyncGate, { props }).body;

function expected(shutter: number, sync: number) {
	const t = nearestMarked(shutter, 'shutter').value;
	const s = nearestMarked(sync, 'shutter').value;
	const cost = hssCost({ shutter: t, syncSpeed: s });
	return { cost: formatNumber(cost, 1), reach: `×${formatNumber(2 ** (-cost / 2), 2)}`, ambient: formatSigned(Math.log2(t / s)) };
}

describe('Sync Gate', () => {
	it('1/1000 s against a 1/250 s sync', () => {
		const body = show({ shutter: '1/1000', sync: '1/250' });
		const e = expected(1 / 1000, 1 / 250);
		expect(textOf(body, 'sync-cost')).toBe(e.cost);
		expect(textOf(body, 'sync-reach')).toBe(e.reach);
		expect(textOf(body, 'sync-ambient')).toBe(`${e.ambient} stops`);
		// APEX (ASA PH2.5-1960): Tv(1/1000) = 10, Tv(1/250) = 8, so the shutter is 2 stops above sync and the ambient 2 stops darker
		expect(textOf(body, 'sync-status')).toContain('Above sync by 2.0 stops');
		expect(textOf(body, 'sync-ambient')).toBe('\u22122.0 stops');
		// common practice, no published source: about 1 stop to enter HSS plus 1 per stop above sync → 3 stops;
		// inverse square turns 3 stops into reach × 2^-1.5 ≈ 0.35
		expect(textOf(body, 'sync-cost')).toBe('3.0');
		expect(textOf(body, 'sync-reach')).toBe('×0.35');
	});

	it('at sync the flash keeps full power', () => {
		const body = show({ shutter: '1/250', sync: '1/250' });
		expect(textOf(body, 'sync-status')).toContain('Within sync');
		expect(textOf(body, 'sync-cost')).toBe(expected(1 / 250, 1 / 250).cost);
		expect(textOf(body, 'sync-cost')).toBe('0.0');
		expect(textOf(body, 'sync-reach')).toBe('×1.00');
	});

	it('slower than sync costs the flash nothing and brightens the ambient', () => {
		const body = show({ shutter: '1/60', sync: '1/250' });
		expect(textOf(body, 'sync-cost')).toBe('0.0');
		// APEX: Tv(1/60) = 6 is two stops below Tv 8
		expect(textOf(body, 'sync-ambient')).toBe('+2.0 stops');
	});

	it('follows other sync speeds as the engine does', () => {
		const body = show({ shutter: '1/2000', sync: '1/200' });
		const e = expected(1 / 2000, 1 / 200);
		expect(textOf(body, 'sync-cost')).toBe(e.cost);
		expect(textOf(body, 'sync-reach')).toBe(e.reach);
		// 1/2000 at a 1/250 sync: 1 + 3 = 4 stops (common practice, no published source)
		expect(textOf(show({ shutter: '1/2000', sync: '1/250' }), 'sync-cost')).toBe('4.0');
	});

	it('draws flash and ambient lines with a marker for the current shutter', () => {
		const body = show({ shutter: '1/1000', sync: '1/250' });
		expect(attrOf(body, 'sync-chart', 'role')).toBe('img');
		expect(body).toContain('stroke-flash');
		expect(body).toContain('stroke-ambient');
		// marker x: Tv 10 on a 5–13 axis drawn from x = 36 to 298 (room for the last label) → 36 + 262·5/8 = 199.75
		expect(Number(attrOf(body, 'sync-chart-marker', 'cx'))).toBeCloseTo(199.75, 2);
	});

	it("takes the learner's own entry cost for their flash", () => {
		const body = show({ shutter: '1/1000', sync: '1/250', entry: '1.7' });
		const cost = hssCost({ shutter: nearestMarked(1 / 1000, 'shutter').value, syncSpeed: nearestMarked(1 / 250, 'shutter').value, entryLoss: 1.7 });
		expect(textOf(body, 'sync-cost')).toBe(formatNumber(cost, 1));
		// 1.7 stops to enter plus APEX Tv 10 − Tv 8 = 2 stops above sync: 3.7 (the per-stop part is common practice, no published source)
		expect(textOf(body, 'sync-cost')).toBe('3.7');
		expect(textOf(body, 'sync-reach')).toBe(`×${formatNumber(2 ** (-3.7 / 2), 2)}`);
		expect(attrOf(body, 'sync-entry', 'value')).toBe('1.7');
		// an entry cost of zero (a flash that loses nothing to switch) leaves only the per-stop cost
		expect(textOf(show({ shutter: '1/1000', sync: '1/250', entry: '0' }), 'sync-cost')).toBe('2.0');
		// at or below sync there is no cost, whatever the entry cost
		expect(textOf(show({ shutter: '1/250', sync: '1/250', entry: '2' }), 'sync-cost')).toBe('0.0');
	});

	it('refuses an entry cost outside 0 to 3 stops with a notice, and uses one stop', () => {
		const body = show({ shutter: '1/1000', sync: '1/250', entry: '9' });
		expect(textOf(body, 'widget-notice')).toContain('entry="9"');
		expect(textOf(body, 'sync-cost')).toBe('3.0');
	});

	it('shows a notice and falls back instead of throwing on bad attributes', () => {
		const body = show({ shutter: 'quick', sync: '1/0' });
		const notice = textOf(body, 'widget-notice');
		expect(notice).toContain('shutter="quick"');
		expect(notice).toContain('sync="1/0"');
		expect(textOf(body, 'sync-cost')).toBe('3.0');
	});
});
