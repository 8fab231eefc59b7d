// For tests and benches: a valid JPEG of a given size, a camera-like frame with filler APP15 segments (which every
// decoder skips), standing in for a large file from a camera without a huge picture to decode.
import { randomBytes } from 'node:crypto';

const SEGMENT_PAYLOAD = 65_533; // a segment's length field counts itself: at most 65 535

export function padJpeg(jpeg: Buffer, targetBytes: number): Buffer {
	if (jpeg[0] !== 0xff || jpeg[1] !== 0xd8) throw new Error('not a JPEG');
	const segments: Buffer[] = [];
	let size = jpeg.length;
	while (size + 4 <= targetBytes) {
		const payload = Math.min(SEGMENT_PAYLOAD, targetBytes - size - 4);
		const header = Buffer.from([0xff, 0xef, (payload + 2) >> 8, (payload + 2) & 0xff]);
		// random filler: nothing along the way can shrink it
		segments.push(header, randomBytes(payload));
		size += payload + 4;
	}
	// after SOI and the APP1 (Exif) segment that follows it, so Exif readers still find it first
	const app1Length = jpeg[2] === 0xff && jpeg[3] === 0xe1 ? 2 + jpeg.readUInt16BE(4) : 0;
	const head = jpeg.subarray(0, 2 + app1Length);
	return Buffer.concat([head, ...segments, jpeg.subarray(2 + app1Length)]);
}
