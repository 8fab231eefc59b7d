import { describe, expect, it } from 'vitest';
import exifr from 'exifr';
import { decodeFlash, describeFlash } from './flash';

describe('decodeFlash', () => {
	// CIPA DC-008-2019 (Exif 2.32), tag 0x9209 Flash: bit 0 fired, bits 1–2 return light, bits 3–4 mode,
	// bit 5 no flash function, bit 6 red-eye reduction
	it('reads 0x0019 as fired in auto mode', () => {
		expect(decodeFlash(0x0019)).toEqual({
			fired: true,
			returnLight: 'no-detection',
			mode: 'auto',
			functionPresent: true,
			redEyeReduction: false,
			raw: 0x19
		});
	});

	it('reads 0x0010 as not fired, compulsory flash suppression', () => {
		const f = decodeFlash(0x0010);
		expect(f?.fired).toBe(false);
		expect(f?.mode).toBe('compulsory-off');
	});

	it('reads 0x0001 as fired with mode unknown', () => {
		expect(decodeFlash(0x0001)).toMatchObject({ fired: true, mode: 'unknown', returnLight: 'no-detection' });
	});

	it('reads the strobe return light bits of 0x0005 and 0x0007', () => {
		expect(decodeFlash(0x0005)).toMatchObject({ fired: true, returnLight: 'not-detected' });
		expect(decodeFlash(0x0007)).toMatchObject({ fired: true, returnLight: 'detected' });
	});

	it('reads 0x0009 as compulsory firing, 0x0020 as no flash function and 0x0041 as red-eye reduction', () => {
		expect(decodeFlash(0x0009)).toMatchObject({ fired: true, mode: 'compulsory-on' });
		expect(decodeFlash(0x0020)).toMatchObject({ fired: false, functionPresent: false });
		expect(decodeFlash(0x0041)).toMatchObject({ fired: true, redEyeReduction: true });
	});

	it('agrees with the exifr reference library on every value it names', () => {
		// exifr's own table of Exif Flash values (npm reference library), key 0x9209 of the exif dictionary
		const table = exifr.tagValues.get('exif')?.get(0x9209) as Record<number, string> | undefined;
		expect(table).toBeDefined();
		const entries = Object.entries(table ?? {});
		expect(entries.length).toBeGreaterThan(15);
		for (const [code, words] of entries) {
			const f = decodeFlash(Number(code));
			expect(f, words).not.toBeNull();
			// a strobe return light can only be seen when the flash fired
			const fired = (/fired/i.test(words) && !/did not fire/i.test(words)) || /^strobe return/i.test(words);
			expect(f?.fired, words).toBe(fired);
			// the Exif table calls both 01 (firing) and 10 (suppression) "compulsory flash mode"
			if (/compulsory/i.test(words)) expect(f?.mode, words).toBe(fired ? 'compulsory-on' : 'compulsory-off');
			if (/auto mode/i.test(words)) expect(f?.mode, words).toBe('auto');
			if (/return light detected/i.test(words)) expect(f?.returnLight, words).toBe('detected');
			if (/return light not detected/i.test(words)) expect(f?.returnLight, words).toBe('not-detected');
			if (/red-eye/i.test(words)) expect(f?.redEyeReduction, words).toBe(true);
			if (/no flash function/i.test(words)) expect(f?.functionPresent, words).toBe(false);
		}
	});

	it('returns null for anything that is not a 16-bit integer', () => {
		for (const bad of [undefined, null, -1, 0x10000, 1.5, '25', NaN]) expect(decodeFlash(bad)).toBeNull();
	});

	it('describes the flash in words', () => {
		expect(describeFlash(decodeFlash(0x1f)!)).toBe('fired, auto mode, return light detected');
		expect(describeFlash(decodeFlash(0x10)!)).toBe('did not fire, forced off');
	});
});
