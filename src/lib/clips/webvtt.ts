// Reads WebVTT caption text (W3C WebVTT: The Web Video Text Tracks Format) far enough to refuse what a browser would not
// show: the signature, every cue's timings, and at least one cue with text. Browser-safe: the clip form checks as you type.

export const MAX_CAPTION_CHARS = 200_000;

export type CaptionCheck = { ok: true; cues: number; lastEnd: number } | { ok: false; message: string };

// a timestamp: optional hours (at least two digits), minutes and seconds 00–59, three digits of milliseconds
const TIMESTAMP = /^(?:(\d{2,}):)?([0-5]\d):([0-5]\d)\.(\d{3})$/;

/** Seconds from a WebVTT timestamp, or null when it is not one. */
export function readTimestamp(text: string): number | null {
	const m = TIMESTAMP.exec(text);
	if (!m) return null;
	return Number(m[1] ?? 0) * 3600 + Number(m[2]) * 60 + Number(m[3]) + Number(m[4]) / 1000;
}

/** The caption text with its line endings made `\n` and a leading byte-order mark dropped (what the server stores). */
export function normaliseCaptions(text: string): string {
	return text.replace(/^\uFEFF/, '').replace(/\r\n?/g, '\n').trim() + '\n';
}

export function checkCaptions(raw: string): CaptionCheck {
	if (raw.length > MAX_CAPTION_CHARS) return { ok: false, message: `The captions are longer than ${MAX_CAPTION_CHARS.toLocaleString('en')} characters.` };
	const text = normaliseCaptions(raw);
	const lines = text.split('\n');
	// the signature: "WEBVTT" alone or followed by a space or tab and any text
	if (!/^WEBVTT(?:[ \t].*)?$/.test(lines[0])) return { ok: false, message: 'Captions must be WebVTT: the first line is “WEBVTT”.' };
	let cues = 0;
	let lastEnd = 0;
	let i = 1;
	// the header runs to the first blank line
	while (i < lines.length && lines[i].trim() !== '') i++;
	while (i < lines.length) {
		while (i < lines.length && lines[i].trim() === '') i++;
		if (i >= lines.length) break;
		const blockStart = i;
		const block: string[] = [];
		while (i < lines.length && lines[i].trim() !== '') block.push(lines[i++]);
		if (/^(NOTE|STYLE|REGION)(?:[ \t]|$)/.test(block[0]) && !block[0].includes('-->')) continue;
		// an optional cue identifier, then the timings line
		const timingAt = block[0].includes('-->') ? 0 : 1;
		const timing = block[timingAt];
		const lineNo = blockStart + timingAt + 1;
		if (timing === undefined || !timing.includes('-->')) return { ok: false, message: `Line ${blockStart + 1}: a cue needs a timing line such as “00:00:01.000 --> 00:00:04.000”.` };
		const [left, right = ''] = timing.split('-->');
		const start = readTimestamp(left.trim());
		const end = readTimestamp(right.trim().split(/[ \t]+/)[0] ?? '');
		if (start === null || end === null) return { ok: false, message: `Line ${lineNo}: “${timing.trim()}” is not a timing line; write times as 00:00:01.000 (minutes, seconds, milliseconds).` };
		if (end <= start) return { ok: false, message: `Line ${lineNo}: the cue ends before it starts.` };
		if (block.length <= timingAt + 1) return { ok: false, message: `Line ${lineNo}: the cue has no text.` };
		if (block.slice(timingAt + 1).some((l) => l.includes('-->'))) return { ok: false, message: `Line ${lineNo}: leave a blank line between cues.` };
		cues++;
		lastEnd = Math.max(lastEnd, end);
	}
	if (cues === 0) return { ok: false, message: 'The captions have no cues: add at least one timing line and its text.' };
	return { ok: true, cues, lastEnd };
}
