// Caption checks against the WebVTT format (W3C WebVTT: The Web Video Text Tracks Format, signature, timestamps, cues).
import { describe, expect, it } from 'vitest';
import { checkCaptions, normaliseCaptions, readTimestamp } from './webvtt';

describe('WebVTT captions', () => {
	it('reads timestamps with and without hours (W3C WebVTT, timestamp syntax)', () => {
		expect(readTimestamp('00:01.500')).toBe(1.5);
		expect(readTimestamp('01:02:03.004')).toBeCloseTo(3723.004, 6);
		expect(readTimestamp('1:02.000')).toBeNull(); // minutes take two digits
		expect(readTimestamp('00:60.000')).toBeNull(); // seconds run 00–59
		expect(readTimestamp('00:01,000')).toBeNull(); // a comma is SubRip, not WebVTT
	});

	it('accepts a file with a header, a note, identifiers, cue settings and CRLF line ends', () => {
		const text = 'WEBVTT - demo\r\n\r\nNOTE written for the demo\r\n\r\n1\r\n00:00.000 --> 00:02.000 line:90%\r\nAt the meter.\r\n\r\n00:02.000 --> 00:04.500\r\nOne stop under.\r\nThe sky deepens.\r\n';
		expect(checkCaptions(text)).toEqual({ ok: true, cues: 2, lastEnd: 4.5 });
		expect(normaliseCaptions(`\uFEFF${text}`)).not.toMatch(/\r|\uFEFF/);
	});

	it('refuses text that is not WebVTT, with the line at fault', () => {
		expect(checkCaptions('1\n00:00:01,000 --> 00:00:02,000\nSubRip\n')).toMatchObject({ ok: false, message: expect.stringMatching(/first line is “WEBVTT”/) });
		expect(checkCaptions('WEBVTTX\n')).toMatchObject({ ok: false });
		expect(checkCaptions('WEBVTT\n\n00:01.000 --> 00:00.500\nbackwards\n')).toMatchObject({ ok: false, message: expect.stringMatching(/Line 3: the cue ends before it starts/) });
		expect(checkCaptions('WEBVTT\n\n00:01.000 --> 00:02.000\n')).toMatchObject({ ok: false, message: expect.stringMatching(/no text/) });
		expect(checkCaptions('WEBVTT\n\nhello\nthere\n')).toMatchObject({ ok: false, message: expect.stringMatching(/Line 3: a cue needs a timing line/) });
		expect(checkCaptions('WEBVTT\n')).toMatchObject({ ok: false, message: expect.stringMatching(/no cues/) });
		expect(checkCaptions('WEBVTT\n\n00:01.000 --> 00:02.000\na\n00:02.000 --> 00:03.000\nb\n')).toMatchObject({ ok: false, message: expect.stringMatching(/blank line between cues/) });
	});
});
