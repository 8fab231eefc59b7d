// LibRaw's command-line output read back: the identify report, the 16-bit PPM, and decodes taken in turn.
import { describe, expect, it } from 'vitest';
import { inTurn, parseIdentify, parsePpm16 } from './raw';

describe('parseIdentify', () => {
	it('reads size, camera and settings from raw-identify -v, turning the size for a quarter-turned frame', () => {
		const text = ['Camera: Stopwise Test Bench One ID: 0x0', 'ISO speed: 200', 'Shutter: 1/1000.0 sec', 'Aperture: f/5.6', 'Focal length: 35.0 mm', 'Output size:  6000 x 4000', 'Image flip: 6'].join('\n');
		expect(parseIdentify(text)).toEqual({ width: 4000, height: 6000, make: 'Stopwise', model: 'Test Bench One', iso: 200, exposureTime: 1 / 1000, fNumber: 5.6, focalLength: 35 });
		expect(parseIdentify(text.replace('Image flip: 6', 'Image flip: 0'))).toMatchObject({ width: 6000, height: 4000 });
	});

	it('answers null for a file LibRaw cannot open', () => {
		expect(parseIdentify('Cannot open frame.raw: Input/output error\n')).toBeNull();
		expect(parseIdentify('Cannot decode frame.raw: Input/output error\n')).toBeNull();
	});
});

describe('parsePpm16', () => {
	it('reads a binary PPM of 16-bit big-endian samples (Netpbm PPM: maxval above 255 takes two bytes, most significant first)', () => {
		const header = Buffer.from('P6\n2 1\n65535\n', 'latin1');
		const body = Buffer.from([0x01, 0x02, 0xff, 0xff, 0x00, 0x00, 0x80, 0x00, 0x00, 0x01, 0x12, 0x34]);
		const image = parsePpm16(Buffer.concat([header, body]));
		expect(image).toMatchObject({ width: 2, height: 1, channels: 3 });
		expect(Array.from(image!.data)).toEqual([0x0102, 0xffff, 0, 0x8000, 1, 0x1234]);
	});

	it('refuses 8-bit, cut-short or empty output', () => {
		expect(parsePpm16(Buffer.from('P6\n2 1\n255\n\0\0\0\0\0\0', 'latin1'))).toBeNull();
		expect(parsePpm16(Buffer.from('P6\n2 1\n65535\n\0\0', 'latin1'))).toBeNull();
		expect(parsePpm16(Buffer.alloc(0))).toBeNull();
	});
});

describe('inTurn', () => {
	it('runs at most two decodes at once and every one of them', async () => {
		let now = 0;
		let most = 0;
		const release: (() => void)[] = [];
		const work = () =>
			inTurn(async () => {
				now++;
				most = Math.max(most, now);
				await new Promise<void>((resolve) => release.push(resolve));
				now--;
				return 'done';
			});
		const all = Promise.all(Array.from({ length: 6 }, work));
		// let each started decode finish in turn until all six have run
		for (let finished = 0; finished < 6; finished++) {
			while (release.length === 0) await new Promise((resolve) => setImmediate(resolve));
			release.shift()!();
		}
		expect(await all).toEqual(Array(6).fill('done'));
		expect(most).toBe(2);
	});
});
