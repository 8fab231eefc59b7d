// Converts decoded 8-bit RGB pixels from their file's ICC profile to sRGB (a phone's HEIC is usually Display P3).
import sharp from 'sharp';

// TIFF 6.0 tags and types (Adobe, 1992); ICCProfile is tag 34675 (ICC.1:2010 annex B.4, embedding in TIFF)
const SHORT = 3;
const LONG = 4;
const UNDEFINED = 7;

/**
 * sharp can convert by an embedded profile but cannot be handed one with raw pixels, so the pixels are wrapped in a
 * minimal uncompressed TIFF (8-bit RGB, one strip) carrying the profile, which sharp then reads and converts to sRGB.
 */
function tiffWithProfile(rgb: Uint8Array, width: number, height: number, icc: Buffer): Buffer {
	const entries: [number, number, number[] | Buffer][] = [
		[256, LONG, [width]], // ImageWidth
		[257, LONG, [height]], // ImageLength
		[258, SHORT, [8, 8, 8]], // BitsPerSample
		[259, SHORT, [1]], // Compression: none
		[262, SHORT, [2]], // PhotometricInterpretation: RGB
		[273, LONG, [0]], // StripOffsets (set below)
		[277, SHORT, [3]], // SamplesPerPixel
		[278, LONG, [height]], // RowsPerStrip
		[279, LONG, [rgb.length]], // StripByteCounts
		[284, SHORT, [1]], // PlanarConfiguration: chunky
		[34675, UNDEFINED, icc] // ICCProfile
	];
	const ifdAt = 8;
	const ifdSize = 2 + entries.length * 12 + 4;
	const bitsAt = ifdAt + ifdSize; // BitsPerSample's three SHORTs do not fit in the entry
	const iccAt = bitsAt + 6;
	const dataAt = iccAt + icc.length + (icc.length % 2);
	(entries[5][2] as number[])[0] = dataAt;
	const out = Buffer.alloc(dataAt + rgb.length);
	out.write('II', 0, 'latin1');
	out.writeUInt16LE(42, 2);
	out.writeUInt32LE(ifdAt, 4);
	out.writeUInt16LE(entries.length, ifdAt);
	entries.forEach(([tag, type, values], i) => {
		const p = ifdAt + 2 + i * 12;
		out.writeUInt16LE(tag, p);
		out.writeUInt16LE(type, p + 2);
		out.writeUInt32LE(values.length, p + 4);
		if (tag === 258) out.writeUInt32LE(bitsAt, p + 8);
		else if (tag === 34675) out.writeUInt32LE(iccAt, p + 8);
		else if (type === SHORT) out.writeUInt16LE((values as number[])[0], p + 8);
		else out.writeUInt32LE((values as number[])[0], p + 8);
	});
	out.writeUInt32LE(0, ifdAt + 2 + entries.length * 12);
	[8, 8, 8].forEach((v, i) => out.writeUInt16LE(v, bitsAt + 2 * i));
	icc.copy(out, iccAt);
	Buffer.from(rgb.buffer, rgb.byteOffset, rgb.byteLength).copy(out, dataAt);
	return out;
}

/** 8-bit RGB in the profile's space → 8-bit sRGB, same size. */
export async function convertToSrgb(rgb: Uint8Array, width: number, height: number, icc: Buffer): Promise<Buffer> {
	return sharp(tiffWithProfile(rgb, width, height, icc)).toColourspace('srgb').removeAlpha().raw({ depth: 'uchar' }).toBuffer();
}
