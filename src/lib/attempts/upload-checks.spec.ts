// Client-side upload checks: messages for wrong type, size and missing frames; progress split per file.
import { describe, expect, it } from 'vitest';
import { ACCEPT, checkChosenFile, formatMegabytes, missingFramesMessage, progressPerFile, tooLargeMessage } from './upload-checks';

const MB = 1024 * 1024;

describe('checkChosenFile', () => {
	it('accepts camera JPEGs and other measurable photos by type or by name', () => {
		expect(checkChosenFile({ name: 'DSC_0042.JPG', type: 'image/jpeg', size: 9 * MB }, 40 * MB)).toBeNull();
		expect(checkChosenFile({ name: 'lit.webp', type: '', size: MB }, 40 * MB)).toBeNull();
	});

	it('accepts phones\' HEIC and raw files by type or by name (the server decodes both)', () => {
		expect(checkChosenFile({ name: 'IMG_1.HEIC', type: 'image/heic', size: MB }, 40 * MB)).toBeNull();
		expect(checkChosenFile({ name: 'IMG_2.heif', type: '', size: MB }, 40 * MB)).toBeNull();
		for (const name of ['run.NEF', 'run.dng', 'run.CR3', 'run.ARW', 'run.RAF', 'run.RW2', 'run.ORF']) {
			expect(checkChosenFile({ name, type: '', size: MB }, 40 * MB), name).toBeNull();
		}
		expect(ACCEPT).toContain('.heic');
		expect(ACCEPT).toContain('.dng');
	});

	it('says what to do with a wrong type, an empty or an oversized file', () => {
		expect(checkChosenFile({ name: 'notes.pdf', type: 'application/pdf', size: MB }, 40 * MB)).toMatch(/not a photo we can read/);
		expect(checkChosenFile({ name: 'a.jpg', type: 'image/jpeg', size: 0 }, 40 * MB)).toMatch(/empty/);
		expect(checkChosenFile({ name: 'a.jpg', type: 'image/jpeg', size: 41 * MB }, 40 * MB)).toBe(
			'This file is 41 MB; the limit is 40 MB. Export a JPEG at full size and normal quality, which stays well under it.'
		);
		// a 45 MP camera's uncompressed raw runs past 40 MB: it is told about the JPEG beside it, not told to export one
		expect(checkChosenFile({ name: 'DSC_0042.NEF', type: '', size: 52 * MB }, 40 * MB)).toBe(
			'This raw file is 52 MB; the limit is 40 MB. Raw files from high-resolution cameras are often larger. Send the JPEG your camera writes beside the raw file (RAW+JPEG), or export a full-size JPEG without edits, the same way for every frame of the pair.'
		);
		expect(tooLargeMessage(null, 40 * MB, 'a.jpg')).toBe('This file is larger than the limit of 40 MB. Export a JPEG at full size and normal quality, which stays well under it.');
	});
});

describe('formatMegabytes', () => {
	it('shows small files in KB and large ones in MB', () => {
		expect(formatMegabytes(300)).toBe('1 KB');
		expect(formatMegabytes(150 * 1024)).toBe('150 KB');
		expect(formatMegabytes(9.44 * MB)).toBe('9.4 MB');
		expect(formatMegabytes(41 * MB)).toBe('41 MB');
	});
});

describe('missingFramesMessage', () => {
	it('names the missing frames', () => {
		expect(missingFramesMessage(['reference', 'lit'], { reference: {} })).toBe('Add the “lit” frame before sending.');
		expect(missingFramesMessage(['reference', 'lit'], {})).toBe('Add the “reference” and “lit” frames before sending.');
		expect(missingFramesMessage(['base', 'minus-one', 'minus-two'], {})).toBe('Add the “base”, “minus-one” and “minus-two” frames before sending.');
		expect(missingFramesMessage(['reference'], { reference: 1 })).toBeNull();
	});
});

describe('progressPerFile', () => {
	it('splits the bytes sent over the files in body order', () => {
		expect(progressPerFile([1000, 3000], 0, 100, 200)).toEqual([0, 0]);
		// lead 100 + header 200 + 500 of the first file
		expect(progressPerFile([1000, 3000], 800, 100, 200)).toEqual([0.5, 0]);
		// first done, second header 200, then 1500 of 3000
		expect(progressPerFile([1000, 3000], 100 + 200 + 1000 + 200 + 1500, 100, 200)).toEqual([1, 0.5]);
		expect(progressPerFile([1000, 3000], 1e9, 100, 200)).toEqual([1, 1]);
	});
});
