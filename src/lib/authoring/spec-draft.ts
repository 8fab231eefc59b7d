// The spec form's working copy: reading spec text into a draft, editing fields from what an author types, writing JSON.
// Pure and isomorphic; the server validates the result (errors by path), so anything unreadable is kept as typed.

export type FieldInput = 'number' | 'seconds' | 'frame' | 'frames' | 'numbers' | 'boolean';

export interface FormField {
	name: string;
	label: string;
	help: string;
	unit: string;
	input: FieldInput;
	required: boolean;
	min: number | null;
	max: number | null;
	step: number | null;
	default: unknown;
}

export interface FormKind {
	kind: string;
	label: string;
	help: string;
	fields: FormField[];
	/** a new criterion of this kind: its required fields filled with examples */
	starter: Record<string, unknown>;
}

export type Criterion = Record<string, unknown> & { kind: string };
export interface Draft {
	title?: string;
	frames: string[];
	sceneEv?: number;
	criteria: Criterion[];
	rubric?: string[];
	[other: string]: unknown;
}

/** The draft in spec text, or null when the text is not a JSON object (the form then waits for valid JSON). */
export function readDraft(text: string): Draft | null {
	let parsed: unknown;
	try {
		parsed = JSON.parse(text);
	} catch {
		return null;
	}
	if (!parsed || typeof parsed !== 'object' || Array.isArray(parsed)) return null;
	const raw = parsed as Record<string, unknown>;
	const frames = Array.isArray(raw.frames) ? raw.frames.map(String) : [];
	const criteria = Array.isArray(raw.criteria)
		? raw.criteria.filter((c): c is Criterion => !!c && typeof c === 'object' && typeof (c as Criterion).kind === 'string')
		: [];
	return { ...raw, frames, criteria } as Draft;
}

/** JSON as stored: two-space indent, empty optional lists left out. */
export function writeDraft(draft: Draft): string {
	const out: Record<string, unknown> = { ...draft };
	if (Array.isArray(out.rubric) && out.rubric.length === 0) delete out.rubric;
	return JSON.stringify(out, null, 2);
}

/** 1/1000, 0.001 or 2 → seconds; anything else is kept as typed. */
export function parseSeconds(typed: string): number | string | undefined {
	const s = typed.trim();
	if (s === '') return undefined;
	const fraction = /^(\d+(?:\.\d+)?)\s*\/\s*(\d+(?:\.\d+)?)$/.exec(s);
	if (fraction) {
		const value = Number(fraction[1]) / Number(fraction[2]);
		return Number.isFinite(value) ? value : s;
	}
	const n = Number(s);
	return s !== '' && Number.isFinite(n) ? n : s;
}

/** Seconds as a camera shows them: 1/1000 for short times, 2 for long ones. */
export function showSeconds(value: unknown): string {
	if (typeof value !== 'number') return value === undefined || value === null ? '' : String(value);
	if (value > 0 && value < 1) {
		const denominator = 1 / value;
		if (Math.abs(denominator - Math.round(denominator)) < 1e-6 * denominator) return `1/${Math.round(denominator)}`;
	}
	return String(value);
}

function parseNumber(typed: string): number | string | undefined {
	const s = typed.trim();
	if (s === '') return undefined;
	const n = Number(s.replace('−', '-'));
	return Number.isFinite(n) ? n : s;
}

/** A field's value from what was typed; undefined means "leave it out" (the default applies). */
export function parseField(input: FieldInput, typed: string): unknown {
	switch (input) {
		case 'number':
			return parseNumber(typed);
		case 'seconds':
			return parseSeconds(typed);
		case 'frame':
			return typed.trim() === '' ? undefined : typed.trim();
		case 'frames': {
			const list = typed.split(',').map((s) => s.trim()).filter(Boolean);
			return list.length ? list : undefined;
		}
		case 'numbers': {
			const list = typed.split(',').map((s) => s.trim()).filter(Boolean);
			return list.length ? list.map((s) => parseNumber(s)) : undefined;
		}
		case 'boolean':
			return typed === 'true' ? true : undefined;
	}
}

/** A field's value as the form shows it. */
export function showField(input: FieldInput, value: unknown): string {
	if (value === undefined || value === null) return '';
	if (input === 'seconds') return showSeconds(value);
	if (Array.isArray(value)) return value.join(', ');
	return String(value);
}

/** Sets or (for undefined) removes a criterion's field. */
export function setField(criterion: Criterion, name: string, value: unknown): void {
	if (value === undefined) delete criterion[name];
	else criterion[name] = value;
}

/** Renames a frame everywhere the draft names it. */
export function renameFrame(draft: Draft, from: string, to: string): void {
	draft.frames = draft.frames.map((f) => (f === from ? to : f));
	for (const c of draft.criteria) {
		for (const key of ['frame', 'reference'] as const) if (c[key] === from) c[key] = to;
		if (Array.isArray(c.frames)) c.frames = c.frames.map((f) => (f === from ? to : f));
	}
}

/** Removes a frame and every reference to it (criteria fall back to their default frames). */
export function removeFrame(draft: Draft, name: string): void {
	draft.frames = draft.frames.filter((f) => f !== name);
	for (const c of draft.criteria) {
		for (const key of ['frame', 'reference'] as const) if (c[key] === name) delete c[key];
		if (Array.isArray(c.frames)) c.frames = c.frames.filter((f) => f !== name);
	}
}

/** A frame name not yet in the list: "frame 3", "frame 4", … */
export function newFrameName(draft: Draft): string {
	for (let i = draft.frames.length + 1; ; i++) if (!draft.frames.includes(`frame ${i}`)) return `frame ${i}`;
}

export function starterCriterion(kind: FormKind): Criterion {
	return structuredClone(kind.starter) as Criterion;
}
