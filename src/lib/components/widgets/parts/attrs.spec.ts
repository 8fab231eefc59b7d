// Attribute reading never throws: good values pass through, bad ones become a notice and the fallback.
import { describe, expect, it } from 'vitest';
import { AttrReader, readFractionText, readNumberText } from './attrs';

describe('readNumberText', () => {
	it('reads plain, signed and comma-decimal numbers', () => {
		expect(readNumberText('2.5')).toBe(2.5);
		expect(readNumberText(' 2,5 ')).toBe(2.5);
		expect(readNumberText('\u22121')).toBe(-1);
		expect(readNumberText('+3')).toBe(3);
		expect(readNumberText(7)).toBe(7);
	});
	it('refuses anything else', () => {
		for (const bad of ['', 'abc', '1e3', '2 stops', '1/4', undefined, null, Number.NaN, Infinity]) expect(readNumberText(bad)).toBeNull();
	});
});

describe('readFractionText', () => {
	it('reads fractions and decimals', () => {
		expect(readFractionText('1/4')).toBe(0.25);
		expect(readFractionText('1 / 16')).toBe(1 / 16);
		expect(readFractionText('0.5')).toBe(0.5);
	});
	it('refuses division by zero and words', () => {
		expect(readFractionText('1/0')).toBeNull();
		expect(readFractionText('quarter')).toBeNull();
	});
});

describe('AttrReader', () => {
	it('takes defaults silently when an attribute is missing or blank', () => {
		const read = new AttrReader();
		expect(read.number('iso', undefined, 100, { min: 50, max: 3200 })).toBe(100);
		expect(read.shutter('sync', '  ', '1/250', { min: 1 / 500, max: 1 / 60 })).toBe(1 / 250);
		expect(read.notices).toEqual([]);
	});
	it('notes a bad or out-of-range number and falls back', () => {
		const read = new AttrReader();
		expect(read.number('iso', 'lots', 100, { min: 50, max: 3200 })).toBe(100);
		expect(read.number('under', '9', 2, { min: 0, max: 4, unit: 'stops' })).toBe(2);
		expect(read.notices).toEqual([
			'iso="lots" is not a number; showing 100 instead.',
			'under="9" must be between 0 and 4 stops; showing 2 stops instead.'
		]);
	});
	it('reads shutter times and apertures as photographers write them', () => {
		const read = new AttrReader();
		expect(read.shutter('shutter', '1/1000', '1/250', { min: 1 / 8000, max: 1 / 30 })).toBe(1 / 1000);
		expect(read.aperture('aperture', 'f/5.6', 8, { min: 1, max: 64 })).toBe(5.6);
		expect(read.notices).toEqual([]);
		expect(read.shutter('shutter', '2"', '1/250', { min: 1 / 8000, max: 1 / 30 })).toBe(1 / 250);
		expect(read.aperture('aperture', 'f/0', 8, { min: 1, max: 64 })).toBe(8);
		expect(read.notices).toHaveLength(2);
	});
	it('reads power fractions up to full power', () => {
		const read = new AttrReader();
		expect(read.fraction('power', '1/4', 1, '1/1')).toBe(0.25);
		expect(read.fraction('power', '2/1', 1, '1/1')).toBe(1);
		expect(read.notices).toEqual(['power="2/1" is not a power like 1/1, 1/4 or 1/16; showing 1/1 instead.']);
	});
	it('matches choices case-insensitively, with aliases', () => {
		const read = new AttrReader();
		expect(read.choice('scene', 'Bright-Sun', ['bright-sun', 'hazy-sun'] as const, 'bright-sun')).toBe('bright-sun');
		expect(read.choice('scene', 'hazy', ['bright-sun', 'hazy-sun'] as const, 'bright-sun', { hazy: 'hazy-sun' })).toBe('hazy-sun');
		expect(read.choice('scene', 'fog', ['bright-sun', 'hazy-sun'] as const, 'bright-sun')).toBe('bright-sun');
		expect(read.notices).toEqual(['scene="fog" is not one of bright-sun, hazy-sun; showing bright-sun instead.']);
	});
	it('keeps the known words of a list in order, noting the unknown ones', () => {
		const read = new AttrReader();
		const allowed = ['stands', 'wind', 'eyes'] as const;
		expect(read.list('topics', 'eyes, lava ,stands,eyes', allowed, ['stands'])).toEqual(['eyes', 'stands']);
		expect(read.notices).toEqual(['topics: unknown lava (known: stands, wind, eyes).']);
		expect(read.list('topics', 'lava', allowed, ['stands'])).toEqual(['stands']);
	});
});
