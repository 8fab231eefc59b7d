// Lesson Markdown from the browser renders like a content file: prose in order, widgets where their lines stand.
import { readFile, readdir } from 'node:fs/promises';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { stripFrontmatter } from './source';
import { renderLessonMarkdown } from './render';

describe('renderLessonMarkdown', () => {
	it('keeps prose and widgets in the order written', async () => {
		const { segments, problems } = await renderLessonMarkdown(
			'## Reach\n\nFirst **bold** words.\n\n<FalloffRuler gn="60" power="1/4" distance="3" iso="100" aperture="8" />\n\nThen more.\n<SafetyNote topics="stands,eyes" />'
		);
		expect(problems).toEqual([]);
		expect(segments.map((s) => (s.kind === 'html' ? 'html' : s.name))).toEqual(['html', 'FalloffRuler', 'html', 'SafetyNote']);
		expect(segments[0]).toMatchObject({ html: expect.stringContaining('<h2>Reach</h2>') });
		expect(segments[0]).toMatchObject({ html: expect.stringContaining('<strong>bold</strong>') });
		expect(segments[1]).toEqual({ kind: 'widget', name: 'FalloffRuler', props: { gn: '60', power: '1/4', distance: '3', iso: '100', aperture: '8' } });
	});

	it('reads a widget tag spread over several lines', async () => {
		const { segments } = await renderLessonMarkdown('<Quiz\n  id="gn-1"\n  question="What is GN at 1/4 power?"\n  answer="24"\n/>\n\nAfter.');
		expect(segments[0]).toEqual({ kind: 'widget', name: 'Quiz', props: { id: 'gn-1', question: 'What is GN at 1/4 power?', answer: '24' } });
		expect(segments[1]).toMatchObject({ kind: 'html', html: expect.stringContaining('After.') });
	});

	it('leaves a widget tag inside a fenced code block as code to read', async () => {
		const { segments, problems } = await renderLessonMarkdown('```\n<StopLadder aperture="8" />\n```');
		expect(problems).toEqual([]);
		expect(segments).toHaveLength(1);
		expect(segments[0]).toMatchObject({ kind: 'html', html: expect.stringContaining('&lt;StopLadder aperture="8" /&gt;') });
	});

	it('leaves out a widget inside a paragraph or list, and says why', async () => {
		const { segments, problems } = await renderLessonMarkdown('Try <StopLadder /> here.\n\n- a list\n  <SyncGate shutter="1/1000" />');
		expect(segments.every((s) => s.kind === 'html')).toBe(true);
		expect(segments.map((s) => (s.kind === 'html' ? s.html : '')).join()).not.toMatch(/stopladder|syncgate/i);
		expect(problems).toEqual([
			expect.stringMatching(/^Line 1: <StopLadder> must start a line of its own/),
			expect.stringMatching(/^Line 4: <SyncGate> must start a line of its own/)
		]);
	});

	it('shows Svelte-looking braces in prose as plain text', async () => {
		const { segments } = await renderLessonMarkdown('Set {shutter} and {@html x} yourself.');
		expect(segments[0]).toMatchObject({ html: '<p>Set {shutter} and {@html x} yourself.</p>' });
	});

	it('collects quiz ids in order and flags one used twice', async () => {
		const { quizIds, problems } = await renderLessonMarkdown(
			'<Quiz id="a" question="1?" answer="1" />\n<Quiz id="b" question="2?" answer="2" />\n<Quiz id="a" question="3?" answer="3" />'
		);
		expect(quizIds).toEqual(['a', 'b']);
		expect(problems).toEqual([expect.stringMatching(/share the id "a"/)]);
	});

	it('allows only our own uploaded images, lazily loaded', async () => {
		const { segments } = await renderLessonMarkdown('![rower](/lesson-images/0123456789abcdef0123.webp)\n\n![elsewhere](https://example.com/x.png)');
		const html = segments.map((s) => (s.kind === 'html' ? s.html : '')).join();
		expect(html).toContain('<img src="/lesson-images/0123456789abcdef0123.webp" alt="rower" loading="lazy" />');
		expect(html).not.toContain('example.com');
	});

	it('marks links that leave the site, and demotes a first-level heading under the page title', async () => {
		const { segments } = await renderLessonMarkdown('# Big\n\n[venue rules](https://example.org/rules) and [a lesson](/courses/x/y)');
		const html = segments.map((s) => (s.kind === 'html' ? s.html : '')).join();
		expect(html).toContain('<h2>Big</h2>');
		expect(html).toContain('<a href="https://example.org/rules" rel="noopener noreferrer nofollow">venue rules</a>');
		expect(html).toContain('<a href="/courses/x/y">a lesson</a>');
	});

	it('says when frontmatter is pasted in, and does not show it', async () => {
		const { segments, problems } = await renderLessonMarkdown('---\ntitle: Pasted\n---\n\nBody text.');
		expect(problems).toEqual([expect.stringMatching(/frontmatter/)]);
		expect(segments).toEqual([{ kind: 'html', html: expect.stringContaining('Body text.') }]);
		expect(JSON.stringify(segments)).not.toContain('Pasted');
	});

	it('copes with hostile text at the size limit (stray brackets, endless tags) and still renders it safely', async () => {
		const brackets = await renderLessonMarkdown(`Text ${'<a onclick'.repeat(9_000)}`);
		expect(brackets.segments.map((s) => (s.kind === 'html' ? s.html : '')).join()).not.toMatch(/onclick=/i);
		const endless = await renderLessonMarkdown(Array.from({ length: 25 }, () => `<Quiz ${'x="1" '.repeat(660)}`).join('\n'));
		expect(endless.segments).toEqual([]);
		expect(endless.problems.length).toBeGreaterThan(0);
	});

	it('renders an empty lesson as nothing, without problems', async () => {
		expect(await renderLessonMarkdown('')).toEqual({ segments: [], problems: [], quizIds: [] });
	});
});

describe('the demo course through the browser pipeline', async () => {
	const dir = join(process.cwd(), 'content', 'daylight-flash-for-action', 'lessons');
	const files = (await readdir(dir)).filter((f) => f.endsWith('.svx')).sort();

	it('finds the lesson files', () => {
		expect(files.length).toBeGreaterThanOrEqual(17);
	});

	for (const file of files) {
		it(`${file} renders with no problems and every widget tag it uses`, async () => {
			const body = stripFrontmatter(await readFile(join(dir, file), 'utf8'));
			const { segments, problems } = await renderLessonMarkdown(body);
			expect(problems).toEqual([]);
			const written = [...body.matchAll(/^<([A-Z]\w*)/gm)].map((m) => m[1]);
			expect(segments.flatMap((s) => (s.kind === 'widget' ? [s.name] : []))).toEqual(written);
		});
	}
});

describe('stripFrontmatter', () => {
	it('drops the YAML block and the blank lines after it, and nothing else', () => {
		expect(stripFrontmatter('---\ntitle: A\nsummary: "x: y"\n---\n\nFirst line.\n\n---\n\nAfter a rule.')).toBe('First line.\n\n---\n\nAfter a rule.');
		expect(stripFrontmatter('No frontmatter.\n')).toBe('No frontmatter.\n');
		expect(stripFrontmatter('---\r\ntitle: A\r\n---\r\nBody')).toBe('Body');
	});
});
