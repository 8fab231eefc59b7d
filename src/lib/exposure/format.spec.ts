import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ExposureInputError } from './errors';
import { formatAperture, formatShutter, parseAperture, parseShutter } from './format';
import { labelNumber, markedSeries, STOP_STEPS } from './series';

const allSteps = [STOP_STEPS.full, STOP_STEPS.half, STOP_STEPS.third];

describe('parseShutter', () => {
	it('reads the ways shutter times are written', () => {
		// common practice, no published source: camera displays and Exif-style fractions
		expect(parseShutter('1/250')).toBe(0.004);
		expect(parseShutter(' 1/8000 s ')).toBe(1 / 8000);
		expect(parseShutter('2"')).toBe(2);
		expect(parseShutter('1"5')).toBe(1.5);
		expect(parseShutter('0.5')).toBe(0.5);
		expect(parseShutter('30s')).toBe(30);
		expect(parseShutter('0.8″')).toBe(0.8);
		expect(parseShutter(0.01)).toBe(0.01);
	});

	it('rejects text that is not a shutter time, with a clear message', () => {
		for (const bad of ['', 'fast', '1/0', '-1/250', '0', '1//250', '1/250/2']) {
			expect(() => parseShutter(bad)).toThrow(ExposureInputError);
		}
		expect(() => parseShutter('fast')).toThrow(/write it like 1\/250/);
	});
});

describe('formatShutter', () => {
	it('shows exact theoretical times as their marks', () => {
		// APEX Tv 8 = 1/256 s is the mark named 1/250 (common practice naming)
		expect(formatShutter(1 / 256)).toBe('1/250');
		expect(formatShutter(2 ** (-1 / 3))).toBe('0.8"');
		expect(formatShutter(2 ** -6)).toBe('1/60');
		expect(formatShutter(32)).toBe('30"');
	});

	it('shows other times literally', () => {
		expect(formatShutter(0.004)).toBe('1/250');
		expect(formatShutter(1 / 3)).toBe('0.33"');
		expect(formatShutter(1 / 70)).toBe('1/70');
		expect(formatShutter(2.5)).toBe('2.5"');
		expect(formatShutter(45)).toBe('45"');
	});

	it('round-trips every marked label', () => {
		for (const step of allSteps) {
			for (const mark of markedSeries('shutter', step)) {
				expect(formatShutter(parseShutter(mark.label))).toBe(mark.label);
				expect(formatShutter(mark.value)).toBe(mark.label);
			}
		}
	});

	it('round-trips any time within 0.1 stop', () => {
		// display rounding only; parse(format(t)) stays close to t (1/3.4 s once showed as 1/3, 0.22 stop off)
		// exception: within 0.01 stop of a mark's exact value the mark's printed name is shown instead
		const marks = [...markedSeries('shutter', 1 / 3), ...markedSeries('shutter', 1 / 2)];
		fc.assert(
			fc.property(fc.double({ min: 1 / 32000, max: 120, noNaN: true }), (t) => {
				const shown = formatShutter(t);
				const mark = marks.find((m) => Math.abs(Math.log2(t / m.value)) <= 0.01);
				if (mark) expect(shown).toBe(mark.label);
				else expect(Math.abs(Math.log2(parseShutter(shown) / t))).toBeLessThan(0.1);
			}),
			{ numRuns: 2000 }
		);
		for (const t of [1 / 3.4, 1 / 3.6, 1 / 4.5, 0.099, 0.2999]) {
			expect(Math.abs(Math.log2(parseShutter(formatShutter(t)) / t))).toBeLessThan(0.1);
		}
		expect(formatShutter(1 / 3.4)).toBe('0.29"');
	});

	it('rejects a non-positive time', () => {
		expect(() => formatShutter(0)).toThrow(ExposureInputError);
	});
});

describe('parseAperture and formatAperture', () => {
	it('reads f-numbers', () => {
		expect(parseAperture('f/5.6')).toBe(5.6);
		expect(parseAperture('F2.8')).toBe(2.8);
		expect(parseAperture('ƒ/4')).toBe(4);
		expect(parseAperture(' 11 ')).toBe(11);
		for (const bad of ['', 'f/', 'wide', 'f/0', 'f/-2']) expect(() => parseAperture(bad)).toThrow(ExposureInputError);
	});

	it('shows exact theoretical f-numbers as their marked names', () => {
		// APEX: f/5.6 is 2^(5/2) = 5.657, f/22 is 2^(9/2) = 22.63, f/1.2 (third) is 2^(1/3) = 1.26
		expect(formatAperture(2 ** 2.5)).toBe('f/5.6');
		expect(formatAperture(2 ** 4.5)).toBe('f/22');
		expect(formatAperture(2 ** (1 / 3))).toBe('f/1.2');
		expect(formatAperture(2 ** 3.5)).toBe('f/11');
	});

	it('shows other f-numbers with one decimal below f/10', () => {
		expect(formatAperture(5.6)).toBe('f/5.6');
		expect(formatAperture(3.3)).toBe('f/3.3');
		expect(formatAperture(0.95)).toBe('f/0.95');
		expect(formatAperture(2)).toBe('f/2');
		expect(formatAperture(12.2)).toBe('f/12');
	});

	it('round-trips every marked label', () => {
		for (const step of allSteps) {
			for (const mark of markedSeries('aperture', step)) {
				expect(formatAperture(parseAperture(mark.label))).toBe(mark.label);
				expect(formatAperture(mark.value)).toBe(mark.label);
				expect(parseAperture(mark.label)).toBe(labelNumber(mark.label));
			}
		}
	});
});
