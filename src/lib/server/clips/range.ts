// The Range header of a GET (RFC 9110 §14.1.2, byte ranges): one range is served as 206, anything else whole or 416.

export type RangeAnswer = { kind: 'whole' } | { kind: 'part'; start: number; end: number } | { kind: 'unsatisfiable' };

/**
 * Reads `bytes=first-last`, `bytes=first-` and `bytes=-suffix` against a value of `size` bytes. A header that is not a
 * single byte range is ignored (the whole value is sent, which RFC 9110 allows); a range wholly past the end is 416.
 */
export function readRange(header: string | null, size: number): RangeAnswer {
	if (!header) return { kind: 'whole' };
	const m = /^bytes=(\d*)-(\d*)$/.exec(header.trim().replace(/\s+/g, ''));
	if (!m || (m[1] === '' && m[2] === '')) return { kind: 'whole' };
	if (m[1] === '') {
		const suffix = Number(m[2]);
		if (suffix === 0 || size === 0) return { kind: 'unsatisfiable' };
		return { kind: 'part', start: Math.max(0, size - suffix), end: size - 1 };
	}
	const start = Number(m[1]);
	const end = m[2] === '' ? size - 1 : Number(m[2]);
	if (!Number.isSafeInteger(start) || !Number.isSafeInteger(end)) return { kind: 'whole' };
	if (start >= size) return { kind: 'unsatisfiable' };
	if (end < start) return { kind: 'whole' };
	return { kind: 'part', start, end: Math.min(end, size - 1) };
}
