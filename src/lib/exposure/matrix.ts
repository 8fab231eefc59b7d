// 3×3 matrix helpers for colour conversions (row-major, acting on column vectors).

/** A 3-vector, e.g. linear RGB or XYZ. */
export type Vec3 = readonly [number, number, number];
/** A 3×3 matrix as three rows. */
export type Mat3 = readonly [Vec3, Vec3, Vec3];

/** Matrix times column vector. */
export function mulVec(m: Mat3, v: Vec3): Vec3 {
	return [
		m[0][0] * v[0] + m[0][1] * v[1] + m[0][2] * v[2],
		m[1][0] * v[0] + m[1][1] * v[1] + m[1][2] * v[2],
		m[2][0] * v[0] + m[2][1] * v[1] + m[2][2] * v[2]
	];
}

/** Matrix product a·b. */
export function mulMat(a: Mat3, b: Mat3): Mat3 {
	const col = (j: number): Vec3 => [b[0][j], b[1][j], b[2][j]];
	const rows = a.map((row) => [0, 1, 2].map((j) => {
		const c = col(j);
		return row[0] * c[0] + row[1] * c[1] + row[2] * c[2];
	}) as unknown as Vec3);
	return rows as unknown as Mat3;
}

/** Inverse by cofactors; the colour matrices used here are all well conditioned. */
export function invert(m: Mat3): Mat3 {
	const [[a, b, c], [d, e, f], [g, h, i]] = m;
	const A = e * i - f * h;
	const B = -(d * i - f * g);
	const C = d * h - e * g;
	const det = a * A + b * B + c * C;
	if (Math.abs(det) < 1e-12) throw new RangeError('matrix is singular');
	return [
		[A / det, -(b * i - c * h) / det, (b * f - c * e) / det],
		[B / det, (a * i - c * g) / det, -(a * f - c * d) / det],
		[C / det, -(a * h - b * g) / det, (a * e - b * d) / det]
	];
}

/** Diagonal matrix. */
export function diag(v: Vec3): Mat3 {
	return [
		[v[0], 0, 0],
		[0, v[1], 0],
		[0, 0, v[2]]
	];
}
