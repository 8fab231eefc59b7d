// The one number formatter: rounding, minus signs, fractions of a stop and singular/plural, as every page shows them.
import { describe, expect, it } from 'vitest';
import {
	formatDecimal,
	formatFocalLength,
	formatFraction,
	formatKelvin,
	formatMetres,
	formatMired,
	formatMm,
	formatNumber,
	formatPercent,
	formatSigned,
	formatStops,
	formatThirds,
	roundTo,
	stopWord,
	unitWord
} from './numbers';

const MINUS = '\u2212';

describe('one rounding rule', () => {
	it('rounds half away from zero, the same on both sides of zero', () => {
		expect(roundTo(0.05, 1)).toBe(0.1);
		expect(roundTo(-0.05, 1)).toBe(-0.1);
		expect(roundTo(0.64, 1)).toBe(0.6);
		expect(roundTo(0.65, 1)).toBe(0.7);
		expect(roundTo(2.5, 0)).toBe(3);
		expect(roundTo(-2.5, 0)).toBe(-3);
		// 1.005 is stored as 1.00499999…; people expect 1.01
		expect(roundTo(1.005, 2)).toBe(1.01);
	});

	it('never shows a negative zero', () => {
		expect(Object.is(roundTo(-0.04, 1), 0)).toBe(true);
		expect(formatNumber(-0.04, 1)).toBe('0.0');
		expect(formatSigned(-0.04, 1)).toBe('0.0');
		expect(formatDecimal(-0.001)).toBe('0');
		expect(formatStops(-0.02)).toBe('0 stops');
		expect(formatMired(-0.4)).toBe('0 mired');
	});

	it('writes a typographic minus and an explicit plus for differences', () => {
		expect(formatNumber(-1.25, 1)).toBe(`${MINUS}1.3`);
		expect(formatNumber(14, 1)).toBe('14.0');
		expect(formatSigned(0.644)).toBe('+0.6');
		expect(formatSigned(-2)).toBe(`${MINUS}2.0`);
		expect(formatSigned(4, 0)).toBe('+4');
		expect(formatDecimal(-1.2)).toBe(`${MINUS}1.2`);
	});
});

describe('stops', () => {
	it('reads the same number the same way everywhere: 0.64 is "0.6 stops", never "0.64 stop"', () => {
		expect(formatStops(0.64)).toBe('0.6 stops');
		expect(formatStops(0.64, { fractions: true })).toBe('0.6 stops');
		expect(formatStops(1)).toBe('1 stop');
		expect(formatStops(1.04)).toBe('1 stop');
		expect(formatStops(1.234)).toBe('1.2 stops');
		expect(formatStops(0)).toBe('0 stops');
		expect(formatStops(-1)).toBe(`${MINUS}1 stop`);
	});

	it('writes the thirds and halves an author typed as fractions, singular up to one', () => {
		expect(formatStops(0.34, { fractions: true })).toBe('⅓ stop');
		expect(formatStops(1 / 2, { fractions: true })).toBe('½ stop');
		expect(formatStops(2 / 3, { fractions: true })).toBe('⅔ stop');
		expect(formatStops(1.5, { fractions: true })).toBe('1½ stops');
		expect(formatStops(2, { fractions: true })).toBe('2 stops');
		expect(formatStops(5 / 3, { fractions: true, signed: true })).toBe('+1⅔ stops');
	});

	it('signs stops on request', () => {
		expect(formatStops(0.6, { signed: true })).toBe('+0.6 stops');
		expect(formatStops(-2, { signed: true })).toBe(`${MINUS}2 stops`);
		expect(formatStops(0.01, { signed: true })).toBe('0 stops');
	});

	it('picks the word from the number as shown', () => {
		expect(stopWord(1)).toBe('stop');
		expect(stopWord(-1.02)).toBe('stop');
		expect(stopWord(0.96)).toBe('stop');
		expect(stopWord(0.94)).toBe('stops');
		expect(stopWord(2)).toBe('stops');
		expect(unitWord('+1', 'stop', 'stops')).toBe('stop');
		expect(unitWord(`${MINUS}⅓`, 'stop', 'stops')).toBe('stop');
		expect(unitWord('1⅓', 'stop', 'stops')).toBe('stops');
	});
});

describe('fractions and thirds', () => {
	it('writes thirds, quarters and halves as glyphs, else one decimal', () => {
		expect(formatFraction(0.33)).toBe('⅓');
		expect(formatFraction(0.67)).toBe('⅔');
		expect(formatFraction(0.25)).toBe('¼');
		expect(formatFraction(0.99)).toBe('1');
		expect(formatFraction(0)).toBe('0');
		expect(formatFraction(-2 / 3)).toBe(`${MINUS}⅔`);
		expect(formatFraction(0.4)).toBe('0.4');
		expect(formatFraction(0.64)).toBe('0.6');
	});

	it('writes slider positions in thirds as mixed fractions', () => {
		expect([0, 1, 2, 3, 4, 5, 6, 7].map(formatThirds)).toEqual(['0', '⅓', '⅔', '1', '1⅓', '1⅔', '2', '2⅓']);
		expect(formatThirds(-4)).toBe(`${MINUS}1⅓`);
	});
});

describe('lengths, colour and shares', () => {
	it('says a full-frame focal length once and a crop sensor with its equivalent', () => {
		expect(formatFocalLength(35, 35)).toBe('35 mm');
		expect(formatFocalLength(35, null)).toBe('35 mm');
		expect(formatFocalLength(23, 35)).toBe('23 mm (35 mm full-frame equivalent)');
		expect(formatFocalLength(4.25, 24)).toBe('4.3 mm (24 mm full-frame equivalent)');
		expect(formatMm(50.4)).toBe('50 mm');
	});

	it('writes metres, kelvin, mired and percentages with their symbols', () => {
		expect(formatMetres(2.54)).toBe('2.5 m');
		expect(formatMetres(10)).toBe('10 m');
		expect(formatMetres(1.256, 2)).toBe('1.26 m');
		expect(formatKelvin(6504)).toBe('6500 K');
		expect(formatMired(59.6)).toBe('60 mired');
		expect(formatMired(159, { signed: true })).toBe('+159 mired');
		expect(formatPercent(0.04)).toBe('0.0%');
	});
});
