// Decodes raw files to linear light with LibRaw's command-line tools (Debian package libraw-bin), in a child process.
import { execFile } from 'node:child_process';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { FrameReadError, malformed, tooManyPixels } from './errors';

export interface RawPixels {
	/** Linear 16-bit RGB (sRGB primaries, camera white balance, no gamma and no tone curve), 0–65535 = black to the sensor's white. */
	data: Uint16Array;
	width: number;
	height: number;
	channels: 3;
}

export interface RawInfo {
	/** Output size, upright, of a full decode. */
	width: number;
	height: number;
	make: string | null;
	model: string | null;
	/** Settings LibRaw read, for files whose Exif exifr cannot follow (CR3, RAF…). */
	iso: number | null;
	exposureTime: number | null;
	fNumber: number | null;
	focalLength: number | null;
}

const DECODE_TIME_LIMIT_MS = 60_000;
// decodes at once in this process: each holds its file, a decoder process and its 16-bit output (about 100 MB for 24 MP);
// more wait their turn, so a burst of raw uploads cannot take the machine's memory
const DECODES_AT_ONCE = 2;
let running = 0;
const waiting: (() => void)[] = [];

export async function inTurn<T>(work: () => Promise<T>): Promise<T> {
	// a finished decode hands its place straight to the next in line, so no newcomer can slip in between
	if (running >= DECODES_AT_ONCE) await new Promise<void>((resolve) => waiting.push(resolve));
	else running++;
	try {
		return await work();
	} finally {
		const next = waiting.shift();
		if (next) next();
		else running--;
	}
}
// a 16-bit PPM of a 150 MP frame halved is 225 MB; the output buffer is bounded a little above that
const MAX_OUTPUT_BYTES = 256 * 1024 * 1024;

function run(cmd: string, args: string[], encoding: 'buffer' | 'utf8'): Promise<{ stdout: Buffer | string; stderr: string }> {
	return new Promise((resolve, reject) => {
		execFile(cmd, args, { encoding, maxBuffer: MAX_OUTPUT_BYTES, timeout: DECODE_TIME_LIMIT_MS, windowsHide: true }, (error, stdout, stderr) => {
			if (error && (error as NodeJS.ErrnoException).code === 'ENOENT') reject(new RawToolMissing(cmd));
			else if (error) reject(error);
			else resolve({ stdout, stderr: String(stderr) });
		});
	});
}

class RawToolMissing extends Error {
	constructor(tool: string) {
		super(`${tool} is not installed (Debian package libraw-bin)`);
	}
}

/** The file as LibRaw needs it: a path. Written to a private temporary folder that is always removed. */
async function withTempFile<T>(bytes: Uint8Array, work: (path: string) => Promise<T>): Promise<T> {
	const folder = await mkdtemp(join(tmpdir(), 'stopwise-raw-'));
	try {
		const path = join(folder, 'frame.raw');
		await writeFile(path, bytes, { mode: 0o600 });
		return await work(path);
	} finally {
		await rm(folder, { recursive: true, force: true });
	}
}

const field = (text: string, name: string) => text.match(new RegExp(`^${name}:\\s*(.+)$`, 'm'))?.[1]?.trim() ?? null;
const numberIn = (text: string | null) => {
	const n = Number(text?.match(/[\d.]+/)?.[0]);
	return Number.isFinite(n) && n > 0 ? n : null;
};

/** Reads what `raw-identify -v` prints; null when LibRaw cannot open or unpack the file. */
export function parseIdentify(text: string): RawInfo | null {
	if (/^Cannot (open|decode|unpack)/m.test(text)) return null;
	const size = field(text, 'Output size')?.match(/(\d+)\s*x\s*(\d+)/);
	if (!size) return null;
	const flip = Number(field(text, 'Image flip') ?? 0);
	let width = Number(size[1]);
	let height = Number(size[2]);
	// LibRaw flip codes 5 and 6 turn the frame a quarter (dcraw's convention); the decode writes it upright
	if (flip === 5 || flip === 6) [width, height] = [height, width];
	const shutter = field(text, 'Shutter');
	const fraction = shutter?.match(/1\/([\d.]+)/);
	const camera = field(text, 'Camera');
	return {
		width,
		height,
		make: camera?.split(' ')[0] ?? null,
		model: camera?.split(' ').slice(1).join(' ').replace(/\s+ID:.*$/, '') || null,
		iso: numberIn(field(text, 'ISO speed')),
		exposureTime: fraction ? 1 / Number(fraction[1]) : numberIn(shutter),
		fNumber: numberIn(field(text, 'Aperture')),
		focalLength: numberIn(field(text, 'Focal length'))
	};
}

/** A binary PPM (P6) of 16-bit samples, big-endian (Netpbm's PPM format), as dcraw_emu writes it. */
export function parsePpm16(bytes: Buffer): RawPixels | null {
	const header = bytes.toString('latin1', 0, Math.min(bytes.length, 64)).match(/^P6\s+(\d+)\s+(\d+)\s+(\d+)\s/);
	if (!header) return null;
	const [whole, w, h, max] = header;
	const width = Number(w);
	const height = Number(h);
	if (Number(max) !== 65535 || bytes.length < whole.length + width * height * 6) return null;
	const data = new Uint16Array(width * height * 3);
	for (let i = 0, p = whole.length; i < data.length; i++, p += 2) data[i] = (bytes[p] << 8) | bytes[p + 1];
	return { data, width, height, channels: 3 };
}

function cannotDecode(label: string): FrameReadError {
	return new FrameReadError(
		'not-decodable',
		`This ${label} file could not be decoded here: the raw decoder does not know this camera or format, or the file is damaged. Upload a JPEG of the same frame instead.`
	);
}

function decoderMissing(label: string): FrameReadError {
	return new FrameReadError(
		'not-decodable',
		`${label.charAt(0).toUpperCase()}${label.slice(1)} files cannot be decoded on this server just now (its raw decoder is not installed). Upload a JPEG of the same frame instead.`
	);
}

/**
 * Identifies the file, checks the pixel limit, then decodes it at half size (each 2 × 2 block of photosites becomes one
 * pixel, with no demosaicing to invent detail) to linear 16-bit sRGB-primaries data: dcraw_emu `-4` (16-bit, gamma 1,
 * no automatic brightening), `-w` (the camera's white balance), `-o 1` (sRGB primaries), `-H 0` (highlights clipped).
 */
export async function decodeRaw(bytes: Uint8Array, label: string, maxPixels: number): Promise<{ pixels: RawPixels; info: RawInfo }> {
	try {
		return await inTurn(() => withTempFile(bytes, async (path) => {
			const identified = await run('raw-identify', ['-v', path], 'utf8');
			const info = parseIdentify(String(identified.stdout));
			if (!info) throw cannotDecode(label);
			if (info.width * info.height > maxPixels) throw tooManyPixels(info.width, info.height, maxPixels);
			const decoded = await run('dcraw_emu', ['-4', '-w', '-o', '1', '-H', '0', '-h', '-Z', '-', path], 'buffer');
			const pixels = parsePpm16(decoded.stdout as Buffer);
			if (!pixels) throw /unexpected end|cannot unpack|input\/output/i.test(decoded.stderr) ? malformed(new Error(decoded.stderr), label) : cannotDecode(label);
			return { pixels, info };
		}));
	} catch (error) {
		if (error instanceof FrameReadError) throw error;
		if (error instanceof RawToolMissing) throw decoderMissing(label);
		throw malformed(error, label);
	}
}
