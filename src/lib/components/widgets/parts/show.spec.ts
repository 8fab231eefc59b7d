// Display formatting: signs, true minus signs and thirds of a stop.
import { describe, expect, it } from 'vitest';
import { showNumber, showStops, showThirds, stopWord } from './show';

describe('show helpers', () => {
	it('prints a typographic minus and never a negative zero', () => {
		expect(showNumber(-1.25, 1)).toBe('\u22121.3');
		expect(showNumber(-0.04, 1)).toBe('0.0');
		expect(showNumber(14, 1)).toBe('14.0');
	});
	it('signs stops', () => {
		expect(showStops(0.644)).toBe('+0.6');
		expect(showStops(-2)).toBe('\u22122.0');
		expect(showStops(0.01)).toBe('0.0');
		expect(showStops(4, 0)).toBe('+4');
	});
	it('writes thirds as mixed fractions', () => {
		expect([0, 1, 2, 3, 4, 5, 6, 7].map(showThirds)).toEqual(['0', '⅓', '⅔', '1', '1⅓', '1⅔', '2', '2⅓']);
		expect(showThirds(-4)).toBe('\u22121⅓');
	});
	it('says stop for exactly one', () => {
		expect(stopWord(1)).toBe('stop');
		expect(stopWord(-1.02)).toBe('stop');
		expect(stopWord(2)).toBe('stops');
	});
});
