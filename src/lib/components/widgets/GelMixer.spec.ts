// Gel Mixer shows the mired sums and the engine's rendered swatches for background (daylight) and subject (flash).
import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import { applyGel, mired, renderedSwatch } from '$lib/exposure';
import GelMixer from './GelMixer.svelte';
import { elementsByTestId, textOf } from './parts/ssr-html';
import { formatNumber, formatSigned } from '$lib/format';

const show = (props: Record<string, string>) => render(GelMixer, { props }).body;
const channels = (hex: string) => [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16));

describe('Gel Mixer', () => {
	it('daylight flash with a full CTO at 3200 K: warm subject, blue background', () => {
		const body = show({ ambient: '5600', flash: '5600', gel: 'full-cto', wb: '3200' });
		const lit = mired(5600) + 159;
		expect(textOf(body, 'gel-subject-offset')).toContain(`${formatSigned(lit - mired(3200), 1)} mired from neutral`);
		expect(textOf(body, 'gel-background-offset')).toContain(`${formatSigned(mired(5600) - mired(3200), 1)} mired from neutral`);
		expect(textOf(body, 'gel-subject-hex')).toBe(renderedSwatch({ lightK: applyGel(5600, 'full-cto'), cameraWbK: 3200 }));
		expect(textOf(body, 'gel-background-hex')).toBe(renderedSwatch({ lightK: 5600, cameraWbK: 3200 }));
		// Mired = 10^6 / K (definition): 5600 K → 178.6, 3200 K → 312.5; full CTO +159 mired (swatch-book value, common
		// practice, no published source) → 337.6 mired ≈ 2962 K, 25.1 mired warmer than the white balance.
		expect(textOf(body, 'gel-ambient-mired')).toBe('1,000,000 / 5600 K = 178.6 mired');
		expect(textOf(body, 'gel-wb-mired')).toBe('1,000,000 / 3200 K = 312.5 mired');
		expect(textOf(body, 'gel-flash-mired')).toBe('1,000,000 / 5600 K = 178.6 + 159 = 337.6 mired ≈ 2962 K');
		expect(textOf(body, 'gel-subject-offset')).toMatch(/^\+25\.1 mired from neutral: warm/);
		expect(textOf(body, 'gel-background-offset')).toMatch(/^\u2212133\.9 mired from neutral: cool \(blue\)/);
		const [r, , b] = channels(textOf(body, 'gel-background-hex'));
		expect(b).toBeGreaterThan(r);
	});

	it('matching light and white balance render an 18 % grey card neutral', () => {
		const body = show({ ambient: '5600', flash: '5600', gel: 'none', wb: '5600' });
		// IEC 61966-2-1 sRGB encoding of 18 % linear: 1.055·0.18^(1/2.4) − 0.055 = 0.461 → 118 = 0x76
		const code = Math.round((1.055 * 0.18 ** (1 / 2.4) - 0.055) * 255).toString(16);
		expect(textOf(body, 'gel-background-hex')).toBe(`#${code}${code}${code}`);
		expect(textOf(body, 'gel-subject-hex')).toBe('#767676');
		expect(textOf(body, 'gel-subject-offset')).toContain('neutral');
	});

	it('a cooling gel follows the engine', () => {
		const body = show({ ambient: '3200', flash: '3200', gel: 'half-ctb', wb: '5600' });
		expect(textOf(body, 'gel-subject-hex')).toBe(renderedSwatch({ lightK: applyGel(3200, 'half-ctb'), cameraWbK: 5600 }));
		expect(textOf(body, 'gel-flash-mired')).toBe(`1,000,000 / 3200 K = 312.5 \u2212 78 = ${formatNumber(312.5 - 78, 1)} mired ≈ ${Math.round(1e6 / 234.5)} K`);
	});

	it('explains a gel that cannot cool a light any further instead of throwing', () => {
		const body = show({ ambient: '5600', flash: '12000', gel: 'full-ctb', wb: '5600' });
		expect(textOf(body, 'gel-error')).toContain('Full CTB cannot cool 12000 K');
		expect(elementsByTestId(body, 'gel-swatches')).toHaveLength(0);
	});

	it('shows a notice and falls back instead of throwing on bad attributes', () => {
		const body = show({ ambient: 'daylight', flash: '5600', gel: 'straw', wb: '99999' });
		const notice = textOf(body, 'widget-notice');
		for (const bit of ['ambient="daylight"', 'gel="straw"', 'wb="99999"']) expect(notice).toContain(bit);
		expect(textOf(body, 'gel-background-hex')).toBe('#767676');
	});
});
