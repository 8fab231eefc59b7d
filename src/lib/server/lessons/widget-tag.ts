// Reads a lesson widget tag standing on its own line(s): its name and plain-string attributes, refusing everything else.
import { WIDGET_ATTRIBUTES, WIDGET_NAMES, isWidgetName, type WidgetName } from '$lib/lessons/widgets';

/** What one tag became: a widget to mount, or nothing (an unknown or unreadable tag), with the reasons. */
export type WidgetTag =
	| { kind: 'widget'; name: WidgetName; props: Record<string, string>; problems: string[]; length: number }
	| { kind: 'refused'; name: string; problems: string[]; length: number };

/** A component-like tag at the very start of a line; an indented one belongs to a list or code block around it. */
export const TAG_START = /^<([A-Z][A-Za-z0-9]*)(?=[\s/>]|$)/;

// a tag longer than this is not a widget someone typed: refuse it rather than scan on
const MAX_TAG_LENGTH = 4000;

const NAMED_ENTITIES: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'", nbsp: '\u00a0' };

/** Decodes the entities an author might use inside a quoted attribute (`&quot;`, `&#39;`, `&#x2019;`). */
export function decodeEntities(value: string): string {
	return value.replace(/&(#x[0-9a-f]{1,6}|#[0-9]{1,7}|[a-z]+);/gi, (whole, ref: string) => {
		if (ref[0] !== '#') return NAMED_ENTITIES[ref.toLowerCase()] ?? whole;
		const code = ref[1] === 'x' || ref[1] === 'X' ? parseInt(ref.slice(2), 16) : parseInt(ref.slice(1), 10);
		return code > 0 && code <= 0x10ffff && !(code >= 0xd800 && code <= 0xdfff) ? String.fromCodePoint(code) : '\ufffd';
	});
}

/**
 * Reads the tag at the start of `text` (which begins at a line matching TAG_START). `line` numbers the messages.
 * `length` is how many characters the tag took, through the end of its last line; anything after the closing `>`
 * on that line makes the tag unreadable, since widgets must stand on their own lines.
 */
export function readWidgetTag(text: string, line: number): WidgetTag {
	const start = TAG_START.exec(text);
	if (!start) throw new Error('readWidgetTag: text does not start with a component tag');
	const name = start[1];
	const where = `Line ${line}: <${name}>`;
	const firstLine = lineEnd(text, 0);
	const scan = scanAttributes(text.slice(0, MAX_TAG_LENGTH), start[0].length, name);
	if (!scan.ok) return { kind: 'refused', name, problems: [`${where} ${scan.message}; it was left out.`], length: firstLine };

	const length = lineEnd(text, scan.end);
	if (text.slice(scan.end, length).trim() !== '') {
		return { kind: 'refused', name, problems: [`${where} must stand on a line of its own; it was left out.`], length: firstLine };
	}
	if (!isWidgetName(name)) {
		return { kind: 'refused', name, problems: [`${where} is not a lesson widget (known: ${WIDGET_NAMES.join(', ')}); it was left out.`], length };
	}

	const allowed: readonly string[] = WIDGET_ATTRIBUTES[name];
	const problems = scan.problems.map((p) => `${where} ${p}`);
	const props: Record<string, string> = {};
	for (const { key, value } of scan.attributes) {
		if (/^on/i.test(key)) problems.push(`${where} ${key} is an event handler; lessons cannot run code, so it was left out.`);
		else if (!allowed.includes(key)) problems.push(`${where} has no attribute ${key} (it takes ${allowed.join(', ')}); it was left out.`);
		else {
			if (Object.hasOwn(props, key)) problems.push(`${where} gives ${key} twice; the last one counts.`);
			props[key] = value;
		}
	}
	return { kind: 'widget', name, props, problems, length };
}

type Scan =
	| { ok: true; end: number; attributes: { key: string; value: string }[]; problems: string[] }
	| { ok: false; message: string };

/** Attribute by attribute up to `/>` (or `></Name>`): quoted or bare values are text; `{…}` is refused. */
function scanAttributes(text: string, from: number, name: string): Scan {
	const attributes: { key: string; value: string }[] = [];
	const problems: string[] = [];
	// sticky patterns read at `i` without copying the rest of the text (linear however long the tag)
	const at = (pattern: RegExp): string | null => {
		pattern.lastIndex = i;
		const match = pattern.exec(text);
		return match ? match[0] : null;
	};
	const SPACE = /\s*/y;
	const KEY = /[^\s=/>{}"'<]+/y;
	const BARE = /[^\s>"'`{}=<]+/y;
	const CLOSING = new RegExp(`>\\s*</${name}\\s*>`, 'y');
	let i = from;
	for (;;) {
		i += at(SPACE)!.length;
		if (i >= text.length) return { ok: false, message: 'is not closed (end it with />)' };
		if (text.startsWith('/>', i)) return { ok: true, end: i + 2, attributes, problems };
		if (text[i] === '>') {
			const closing = at(CLOSING);
			if (closing) return { ok: true, end: i + closing.length, attributes, problems };
			return { ok: false, message: 'cannot hold content: write it as one self-closing tag ending in />' };
		}
		if (text[i] === '{') {
			const close = matchBrace(text, i);
			if (close < 0) return { ok: false, message: 'has an unclosed {' };
			problems.push('has an expression {…}; attributes are plain text in quotes, so it was left out.');
			i = close + 1;
			continue;
		}
		const key = at(KEY);
		if (!key) return { ok: false, message: `has a stray "${text[i]}"` };
		i += key.length;
		i += at(SPACE)!.length;
		if (text[i] !== '=') {
			attributes.push({ key, value: '' });
			continue;
		}
		i++;
		i += at(SPACE)!.length;
		const quote = text[i];
		if (quote === '"' || quote === "'") {
			const close = text.indexOf(quote, i + 1);
			if (close < 0) return { ok: false, message: `has an unclosed quote in ${key}` };
			attributes.push({ key, value: decodeEntities(text.slice(i + 1, close)) });
			i = close + 1;
		} else if (quote === '{') {
			const close = matchBrace(text, i);
			if (close < 0) return { ok: false, message: `has an unclosed { in ${key}` };
			problems.push(`sets ${key} with an expression {…}; attributes are plain text in quotes, so it was left out.`);
			i = close + 1;
		} else {
			let bare = at(BARE) ?? '';
			// `gn=60/>`: the slash belongs to the closing `/>`
			if (bare.endsWith('/') && text[i + bare.length] === '>') bare = bare.slice(0, -1);
			if (!bare) return { ok: false, message: `has no value for ${key}` };
			attributes.push({ key, value: decodeEntities(bare) });
			i += bare.length;
		}
	}
}

/** Index of the `}` closing the `{` at `open`, counting nesting; -1 when unclosed. */
function matchBrace(text: string, open: number): number {
	let depth = 0;
	for (let i = open; i < text.length; i++) {
		if (text[i] === '{') depth++;
		else if (text[i] === '}' && --depth === 0) return i;
	}
	return -1;
}

/** Index just past the end of the line holding `at` (past its newline, or the text's end). */
function lineEnd(text: string, at: number): number {
	const nl = text.indexOf('\n', at);
	return nl < 0 ? text.length : nl + 1;
}
