// Deterministic value noise for the scene textures: integer hashing only, so every render is byte-for-byte repeatable.

/** A 32-bit integer hash of a lattice point and a seed, mapped to [0, 1). */
function hash2(ix: number, iy: number, seed: number): number {
	let h = Math.imul(ix | 0, 0x27d4eb2d) ^ Math.imul(iy | 0, 0x165667b1) ^ Math.imul(seed | 0, 0x9e3779b1);
	h = Math.imul(h ^ (h >>> 15), 0x85ebca6b);
	h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35);
	h ^= h >>> 16;
	return (h >>> 0) / 4294967296;
}

const smooth = (t: number) => t * t * (3 - 2 * t);

/** Smooth value noise in [0, 1) at (x, y); one lattice cell per unit. */
export function valueNoise(x: number, y: number, seed: number): number {
	const ix = Math.floor(x);
	const iy = Math.floor(y);
	const fx = smooth(x - ix);
	const fy = smooth(y - iy);
	const a = hash2(ix, iy, seed);
	const b = hash2(ix + 1, iy, seed);
	const c = hash2(ix, iy + 1, seed);
	const d = hash2(ix + 1, iy + 1, seed);
	return a + (b - a) * fx + (c - a) * fy + (a - b - c + d) * fx * fy;
}

/** Fractal sum of `octaves` layers of value noise, each twice as fine and half as strong, in [0, 1). */
export function fbm(x: number, y: number, seed: number, octaves = 4): number {
	let sum = 0;
	let amp = 0.5;
	let norm = 0;
	let f = 1;
	for (let o = 0; o < octaves; o++) {
		sum += amp * valueNoise(x * f, y * f, seed + o * 101);
		norm += amp;
		amp *= 0.5;
		f *= 2;
	}
	return sum / norm;
}

/** A repeatable pseudo-random number in [0, 1) for an integer index (placing holds, stones, tufts). */
export function scatter(index: number, seed: number): number {
	return hash2(index, index * 7 + 3, seed);
}
