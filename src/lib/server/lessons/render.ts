// Renders lesson Markdown (a course file's or one written in the browser): mdsvex compiles the prose, off the request
// thread and bounded in cost and time, which is sanitised into HTML segments; widget tags on their own lines become
// allow-listed widget segments with string props. Nothing runs.
import { compileInPool, type CompiledChunk } from './compile-pool';
import { renderCostProblem } from './render-cost';
import type { LessonSegment } from '$lib/lessons/widgets';
import { isWidgetName } from '$lib/lessons/widgets';
import { sanitiseLessonHtml } from './sanitise';
import { TAG_START, readWidgetTag } from './widget-tag';

export interface RenderedLesson {
	segments: LessonSegment[];
	/** What was left out or needs the author's attention, each naming its line where it can. */
	problems: string[];
	/** The ids of the lesson's quizzes, in order (a lesson is complete when all are answered right). */
	quizIds: string[];
}

// a widget tag may run over a few lines (long quiz questions); never scan further than this for its end
const TAG_WINDOW_LINES = 40;
// a fenced code block opens with three or more backticks or tildes; widget tags inside it are example text
const FENCE = /^ {0,3}(`{3,}|~{3,})/;

// a note is a widget tag's problem, kept in its place so problems read in the order of the text
type Piece = { kind: 'prose'; source: string; firstLine: number } | { kind: 'note'; text: string } | Extract<LessonSegment, { kind: 'widget' }>;

export async function renderLessonMarkdown(markdown: string): Promise<RenderedLesson> {
	const tooHeavy = renderCostProblem(markdown);
	// refused before any compiling: the whole text as plain text, and why
	if (tooHeavy) return { segments: [{ kind: 'html', html: plainText(markdown) }], problems: [tooHeavy], quizIds: [] };

	const problems: string[] = [];
	const pieces = splitPieces(markdown);
	const prose = pieces.filter((p): p is Extract<Piece, { kind: 'prose' }> => p.kind === 'prose');
	const compiled = await compileInPool(prose.map((p) => p.source));
	if (!compiled.ok) problems.push(compiled.message);
	const segments: LessonSegment[] = [];
	let next = 0;
	for (const piece of pieces) {
		if (piece.kind === 'note') {
			problems.push(piece.text);
			continue;
		}
		if (piece.kind === 'widget') {
			segments.push(piece);
			continue;
		}
		const result = compiled.ok ? compiled.chunks[next++] : null;
		const html = (result ? proseHtml(result, piece.source, piece.firstLine, problems) : plainText(piece.source)).trim();
		if (html) segments.push({ kind: 'html', html });
	}
	return { segments, problems, quizIds: collectQuizIds(segments, problems) };
}

/** The text cut into prose stretches (blank ones dropped), widget tags and their problems, in order. */
function splitPieces(markdown: string): Piece[] {
	const lines = markdown.replace(/\r\n?/g, '\n').split('\n');
	const pieces: Piece[] = [];
	let chunk: string[] = [];
	let chunkStart = 1;
	let fence: { char: string; length: number } | null = null;

	const flush = (nextLine: number) => {
		const source = chunk.join('\n');
		if (source.trim()) pieces.push({ kind: 'prose', source, firstLine: chunkStart });
		chunk = [];
		chunkStart = nextLine;
	};

	for (let i = 0; i < lines.length; ) {
		const line = lines[i];
		if (fence) {
			const closing = /^ {0,3}(`{3,}|~{3,})\s*$/.exec(line)?.[1];
			if (closing && closing[0] === fence.char && closing.length >= fence.length) fence = null;
		} else if (FENCE.test(line)) {
			const mark = FENCE.exec(line)![1];
			fence = { char: mark[0], length: mark.length };
		} else if (TAG_START.test(line)) {
			flush(i + 1);
			const tag = readWidgetTag(lines.slice(i, i + TAG_WINDOW_LINES).join('\n'), i + 1);
			for (const text of tag.problems) pieces.push({ kind: 'note', text });
			if (tag.kind === 'widget') pieces.push({ kind: 'widget', name: tag.name, props: tag.props });
			i += linesIn(lines.slice(i, i + TAG_WINDOW_LINES).join('\n').slice(0, tag.length));
			chunkStart = i + 1;
			continue;
		}
		chunk.push(line);
		i++;
	}
	flush(lines.length + 1);
	return pieces;
}

/** How many lines a slice that ends at a line end (or the text's end) spans. */
function linesIn(slice: string): number {
	const newlines = slice.split('\n').length - 1;
	return Math.max(1, slice.endsWith('\n') ? newlines : newlines + 1);
}

function collectQuizIds(segments: LessonSegment[], problems: string[]): string[] {
	const ids: string[] = [];
	for (const s of segments) {
		if (s.kind !== 'widget' || s.name !== 'Quiz') continue;
		const id = (s.props.id ?? '').trim();
		if (!id) continue;
		if (ids.includes(id)) problems.push(`Two quizzes share the id "${id}": give each its own, or their saved answers mix up.`);
		else ids.push(id);
	}
	return ids;
}

// mdsvex turns frontmatter into this module script; it is ours to drop, not the author's code to report
const FRONTMATTER_SCRIPT = /^\s*<script context="module">\s*export const metadata = .*;\s*const \{[^}]*\} = metadata;\s*<\/script>/;

/** One compiled stretch of prose between widgets → sanitised HTML, noting what the sanitiser is about to leave out. */
function proseHtml(result: CompiledChunk, source: string, firstLine: number, problems: string[]): string {
	if (!result.ok) {
		problems.push(`Line ${firstLine}: this part could not be read as Markdown (${result.message}); it is shown as plain text.`);
		return plainText(source);
	}
	let code = result.code;
	if (result.frontmatter) {
		problems.push(`Line ${firstLine}: frontmatter (--- … ---) is not used in the browser: set the title and summary in the fields above.`);
		code = code.replace(FRONTMATTER_SCRIPT, '');
	}
	noteLeftOut(code, source, firstLine, problems);
	return sanitiseLessonHtml(code);
}

/** Text shown as it stands, escaped. */
function plainText(source: string): string {
	return sanitiseLessonHtml(`<p>${escapeHtml(source)}</p>`);
}

const REFUSED_HTML: [RegExp, string][] = [
	[/<\s*script\b/i, '<script> is not allowed: lessons cannot run code'],
	[/<\s*style\b/i, '<style> is not allowed: lessons use the site’s own look'],
	[/<\s*svelte:/i, 'Svelte elements such as <svelte:head> are not allowed'],
	[/<\s*(iframe|object|embed|frame|frameset|applet|base|meta|link|form)\b/i, 'embedded pages, forms and page-level tags are not allowed'],
	[/(?:href|src)\s*=\s*["']?\s*(?:javascript|vbscript|data)\s*:/i, 'javascript:, vbscript: and data: addresses are not allowed']
];

/** Reports what the sanitiser will drop, so the author knows why something is missing from the preview. */
function noteLeftOut(code: string, source: string, firstLine: number, problems: string[]): void {
	// escaped text (code blocks, &lt;) is safe as it stands; only live markup matters here
	for (const [pattern, message] of REFUSED_HTML) {
		if (pattern.test(code)) problems.push(`${lineOf(source, pattern, firstLine)}${message}; it was left out.`);
	}
	// tag by tag ([^<>] keeps this linear however many stray brackets the text holds)
	const handler = [...code.matchAll(/<[^<>]*>/g)].find((tag) => /\son[a-z]+\s*=/i.test(tag[0]));
	if (handler) {
		const name = /\s(on[a-z]+)\s*=/i.exec(handler[0])![1];
		problems.push(`${lineOf(source, new RegExp(`\\s${name}\\s*=`, 'i'), firstLine)}event handler attributes (${name}, …) are not allowed; they were left out.`);
	}
	const components = new Set([...code.matchAll(/<([A-Z][A-Za-z0-9]*)(?=[\s/>])/g)].map((m) => m[1]));
	for (const name of components) {
		const at = lineOf(source, new RegExp(`<${name}(?=[\\s/>])`), firstLine);
		problems.push(
			isWidgetName(name)
				? `${at}<${name}> must start a line of its own (not inside a paragraph, list or quote, and not indented); it was left out.`
				: `${at}<${name}> is not a lesson widget; it was left out.`
		);
	}
}

function lineOf(source: string, pattern: RegExp, firstLine: number): string {
	const hit = pattern.exec(source);
	return hit ? `Line ${firstLine + source.slice(0, hit.index).split('\n').length - 1}: ` : '';
}

function escapeHtml(text: string): string {
	return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}
