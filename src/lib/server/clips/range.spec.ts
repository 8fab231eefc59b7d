// Byte ranges as RFC 9110 §14.1.2 defines them (examples from its text on a 10000-byte representation).
import { describe, expect, it } from 'vitest';
import { readRange } from './range';

describe('Range header', () => {
	it('reads the forms of a single byte range (RFC 9110 §14.1.2 examples)', () => {
		expect(readRange('bytes=0-499', 10000)).toEqual({ kind: 'part', start: 0, end: 499 });
		expect(readRange('bytes=500-999', 10000)).toEqual({ kind: 'part', start: 500, end: 999 });
		expect(readRange('bytes=-500', 10000)).toEqual({ kind: 'part', start: 9500, end: 9999 });
		expect(readRange('bytes=9500-', 10000)).toEqual({ kind: 'part', start: 9500, end: 9999 });
		expect(readRange('bytes=0-', 10000)).toEqual({ kind: 'part', start: 0, end: 9999 });
	});

	it('clamps a last position past the end, and a suffix longer than the value (RFC 9110 §14.1.2)', () => {
		expect(readRange('bytes=9000-20000', 10000)).toEqual({ kind: 'part', start: 9000, end: 9999 });
		expect(readRange('bytes=-20000', 10000)).toEqual({ kind: 'part', start: 0, end: 9999 });
	});

	it('answers 416 for a range starting past the end or an empty suffix (RFC 9110 §15.5.17)', () => {
		expect(readRange('bytes=10000-', 10000)).toEqual({ kind: 'unsatisfiable' });
		expect(readRange('bytes=-0', 10000)).toEqual({ kind: 'unsatisfiable' });
	});

	it('sends the whole value for no header, other units, several ranges or nonsense (RFC 9110 §14.2: a server may ignore Range)', () => {
		for (const h of [null, '', 'items=0-5', 'bytes=0-1,5-9', 'bytes=5-1', 'bytes=-', 'bytes=a-b']) expect(readRange(h, 10000), String(h)).toEqual({ kind: 'whole' });
	});
});
