import { describe, expect, it } from 'vitest';
import { formatAmount, formatKelvin, formatMired, formatOffset, formatStopAmount, formatStops, formatTarget } from './format';

describe('format', () => {
	it('writes thirds and halves of a stop as photographers do', () => {
		expect(formatAmount(0.34)).toBe('⅓');
		expect(formatAmount(0.33)).toBe('⅓');
		expect(formatAmount(0.67)).toBe('⅔');
		expect(formatAmount(1.5)).toBe('1½');
		expect(formatAmount(2)).toBe('2');
		expect(formatAmount(0)).toBe('0');
		expect(formatAmount(0.99)).toBe('1');
		expect(formatAmount(-2 / 3)).toBe('−⅔');
		expect(formatAmount(0.4)).toBe('0.4');
	});

	it('writes targets, amounts, offsets and measured stops', () => {
		expect(formatTarget(2, 0.34)).toBe('2 ± ⅓');
		expect(formatStopAmount(0.34)).toBe('⅓ stop');
		expect(formatStopAmount(2)).toBe('2 stops');
		expect(formatOffset(1)).toBe('+1');
		expect(formatOffset(-1)).toBe('−1');
		expect(formatStops(1.234)).toBe('1.2 stops');
		expect(formatStops(-1)).toBe('1 stop');
	});

	it('rounds colour temperature to 100 K and mireds to whole numbers', () => {
		expect(formatKelvin(6504)).toBe('6500 K');
		expect(formatMired(59.6)).toBe('60 mireds');
		expect(formatMired(1.2)).toBe('1 mired');
	});
});
