// Authored Markdown cannot run code: payloads written after the well-known vectors of the
// OWASP XSS Filter Evasion Cheat Sheet (and Markdown/Svelte-specific ones) come out inert.
import { compile } from 'mdsvex';
import { describe, expect, it } from 'vitest';
import { WIDGET_ATTRIBUTES, type LessonSegment } from '$lib/lessons/widgets';
import { renderLessonMarkdown } from './render';

/** Numeric character references as browsers read them in attributes: the semicolon is optional. */
function decodeAsBrowser(value: string): string {
	return value
		.replace(/&#(x[0-9a-f]+|\d+);?/gi, (_, ref: string) => String.fromCodePoint(ref[0].toLowerCase() === 'x' ? parseInt(ref.slice(1), 16) : Number(ref)))
		.replace(/&(colon|tab|newline);/gi, (_, name: string) => ({ colon: ':', tab: '\t', newline: '\n' })[name.toLowerCase()] ?? '');
}

/** Everything in rendered HTML that could run script, restyle the page or pull in another document. */
function findDanger(html: string): string[] {
	const found: string[] = [];
	const tags = /<\s*(script|style|iframe|frame|object|embed|svg|math|meta|link|base|form|input|body|applet|template)\b/gi;
	for (const m of html.matchAll(tags)) found.push(`<${m[1].toLowerCase()}>`);
	for (const m of html.matchAll(/<[^>]*?\s(on[a-z]+)\s*=/gi)) found.push(`handler ${m[1]}`);
	for (const m of html.matchAll(/<[^>]*?\sstyle\s*=/gi)) found.push(`style attribute ${m[0]}`);
	for (const m of html.matchAll(/\s(?:href|src|action|formaction|background|data|xlink:href)\s*=\s*(?:"([^"]*)"|'([^']*)'|([^\s>]+))/gi)) {
		// browsers decode entities and ignore whitespace and control characters inside a scheme
		const url = decodeAsBrowser(m[1] ?? m[2] ?? m[3] ?? '').replace(/[\u0000-\u0020]/g, '');
		if (/^(javascript|vbscript|data|livescript):/i.test(url)) found.push(`url ${url}`);
	}
	// components other than the allow-listed widgets must not reach the page as markup
	for (const m of html.matchAll(/<(evil|component|svelte:[a-z]+)\b/gi)) found.push(`<${m[1]}>`);
	return found;
}

const htmlOf = (segments: LessonSegment[]) => segments.map((s) => (s.kind === 'html' ? s.html : '')).join('\n');
const widgetsOf = (segments: LessonSegment[]) => segments.filter((s) => s.kind === 'widget');

// Each vector is named as the cheat sheet lists it; the payloads are written here for this test.
const HTML_VECTORS: [string, string][] = [
	['basic script tag', '<script>alert("XSS")</script>'],
	['script with external source', '<SCRIPT SRC=//evil.example/xss.js></SCRIPT>'],
	['mixed-case script', '<ScRiPt>alert(1)</sCrIpT>'],
	['extraneous open brackets', '<<SCRIPT>alert("XSS");//\\<</SCRIPT>'],
	['non-alpha-non-digit after tag name', '<SCRIPT/XSS SRC="//evil.example/xss.js"></SCRIPT>'],
	['img onerror', '<img src=x onerror=alert(1)>'],
	['img onerror without quotes or spaces', '<IMG SRC=/ onerror="alert(String.fromCharCode(88,83,83))"></img>'],
	['img javascript: src', '<IMG SRC="javascript:alert(\'XSS\');">'],
	['case-insensitive javascript:', '<IMG SRC=JaVaScRiPt:alert(\'XSS\')>'],
	['decimal HTML character references', '<IMG SRC=&#106;&#97;&#118;&#97;&#115;&#99;&#114;&#105;&#112;&#116;&#58;&#97;&#108;&#101;&#114;&#116;&#40;&#39;&#88;&#83;&#83;&#39;&#41;>'],
	['hex HTML character references without semicolons', '<IMG SRC=&#x6A&#x61&#x76&#x61&#x73&#x63&#x72&#x69&#x70&#x74&#x3A&#x61&#x6C&#x65&#x72&#x74&#x28&#x27&#x58&#x53&#x53&#x27&#x29>'],
	['embedded tab in javascript:', '<IMG SRC="jav\tascript:alert(\'XSS\');">'],
	['embedded encoded newline', '<IMG SRC="jav&#x0A;ascript:alert(\'XSS\');">'],
	['malformed img with script inside quotes', '<IMG """><SCRIPT>alert("XSS")</SCRIPT>"\\>'],
	['svg onload', '<svg/onload=alert(1)>'],
	['svg with script child', '<svg><script>alert(1)</script></svg>'],
	['body onload', '<BODY ONLOAD=alert(\'XSS\')>'],
	['anchor javascript: href', '<a href="javascript:alert(document.cookie)">click</a>'],
	['anchor with entity-encoded javascript:', '<a href="&#106;avascript:alert(1)">click</a>'],
	['anchor with named-entity colon', '<a href="javascript&colon;alert(1)">click</a>'],
	['anchor with vbscript:', '<a href="vbscript:msgbox(1)">click</a>'],
	['anchor with data: URL', '<a href="data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==">click</a>'],
	['iframe', '<IFRAME SRC="javascript:alert(\'XSS\');"></IFRAME>'],
	['iframe srcdoc', '<iframe srcdoc="<script>alert(1)</script>"></iframe>'],
	['style tag', '<STYLE>@import\'//evil.example/xss.css\';</STYLE>'],
	['style attribute with url(javascript:)', '<DIV STYLE="background-image: url(javascript:alert(\'XSS\'))">x</DIV>'],
	['meta refresh', '<META HTTP-EQUIV="refresh" CONTENT="0;url=javascript:alert(\'XSS\');">'],
	['object with data', '<OBJECT TYPE="text/x-scriptlet" DATA="//evil.example/scriptlet.html"></OBJECT>'],
	['embed with data: svg', '<EMBED SRC="data:image/svg+xml;base64,PHN2Zz48c2NyaXB0PmFsZXJ0KDEpPC9zY3JpcHQ+PC9zdmc+">'],
	['base href', '<BASE HREF="javascript:alert(\'XSS\');//">'],
	['link stylesheet', '<LINK REL="stylesheet" HREF="javascript:alert(\'XSS\');">'],
	['table background', '<TABLE BACKGROUND="javascript:alert(\'XSS\')"><tr><td>x</td></tr></TABLE>'],
	['input image', '<INPUT TYPE="IMAGE" SRC="javascript:alert(\'XSS\');">'],
	['form action', '<form action="javascript:alert(1)"><button>go</button></form>'],
	['attribute breaking out of a quoted value', '<a href="/ok" title="x" onmouseover="alert(1)">hover</a>'],
	['attribute breaking with a stray quote', '<img src="/lesson-images/0123456789abcdef0123.webp"" onerror="alert(1)">'],
	['details ontoggle', '<details open ontoggle=alert(1)>x</details>'],
	['Svelte head element', '<svelte:head><script>alert(1)</script></svelte:head>'],
	['Svelte window handler', '<svelte:window onload={() => alert(1)} />']
];

const MARKDOWN_VECTORS: [string, string][] = [
	['Markdown link to javascript:', '[click me](javascript:alert(1))'],
	['Markdown link, mixed case', '[click me](JaVaScRiPt:alert(1))'],
	['Markdown link, entity-encoded', '[click me](&#106;avascript:alert(1))'],
	['Markdown link in angle brackets', '[click me](<javascript:alert(1)>)'],
	['Markdown image with javascript:', '![x](javascript:alert(1))'],
	['Markdown image with data: URL', '![x](data:image/svg+xml;base64,PHN2ZyBvbmxvYWQ9YWxlcnQoMSk+)'],
	['Markdown link to data: text/html', '[x](data:text/html,<script>alert(1)</script>)'],
	['autolink to javascript:', '<javascript:alert(1)>'],
	['reference link to javascript:', '[x][evil]\n\n[evil]: javascript:alert(1)'],
	['inline HTML in a paragraph', 'Some text <img src=x onerror=alert(1)> more text'],
	['unknown component on its own line', '<Evil />'],
	['unknown component with children', '<Component>\n<script>alert(1)</script>\n</Component>'],
	['Svelte expression in text', 'Hello {@html "<img src=x onerror=alert(1)>"} there'],
	['Svelte block in text', '{#if true}<script>alert(1)</script>{/if}'],
	['fenced code with a script', '```html\n<script>alert(1)</script>\n```']
];

describe('authored Markdown against XSS vectors (OWASP XSS Filter Evasion Cheat Sheet)', () => {
	for (const [name, payload] of [...HTML_VECTORS, ...MARKDOWN_VECTORS]) {
		it(`neutralises: ${name}`, async () => {
			const { segments } = await renderLessonMarkdown(`Intro paragraph.\n\n${payload}\n\nOutro paragraph.`);
			const html = htmlOf(segments);
			expect(findDanger(html), html).toEqual([]);
			// the prose around the payload survives: sanitising is not throwing the lesson away
			expect(html).toContain('Intro paragraph.');
			expect(html).toContain('Outro paragraph.');
			expect(widgetsOf(segments)).toEqual([]);
		});
	}

	it('the payloads are live before sanitising (so the checks above can fail)', async () => {
		const vectors = [...HTML_VECTORS, ...MARKDOWN_VECTORS].filter(([name]) => !/fenced code|Svelte expression|Svelte block|unknown component with|autolink|Markdown image with data|reference link|data: text\/html/.test(name));
		for (const [name, payload] of vectors) {
			const raw = (await compile(payload, { smartypants: false, highlight: false }))?.code ?? '';
			expect(findDanger(raw).length, `${name}: ${raw}`).toBeGreaterThan(0);
		}
	});

	it('reports script and style to the author', async () => {
		const { problems } = await renderLessonMarkdown('Text\n\n<script>alert(1)</script>\n\n<style>p{}</style>');
		expect(problems.join('\n')).toMatch(/<script> is not allowed/);
		expect(problems.join('\n')).toMatch(/<style> is not allowed/);
	});
});

describe('widget tags in authored Markdown', () => {
	it('drops an expression attribute {…}, keeping the string ones', async () => {
		const { segments, problems } = await renderLessonMarkdown('<Quiz id="q1" question="Two?" answer={alert(1)} />');
		expect(segments).toEqual([{ kind: 'widget', name: 'Quiz', props: { id: 'q1', question: 'Two?' } }]);
		expect(problems.join()).toMatch(/expression/);
	});

	it('drops a spread {...props}', async () => {
		const { segments } = await renderLessonMarkdown('<FalloffRuler {...$$props} gn="60" />');
		expect(segments).toEqual([{ kind: 'widget', name: 'FalloffRuler', props: { gn: '60' } }]);
	});

	it('keeps braces inside a quoted value as inert text', async () => {
		const { segments } = await renderLessonMarkdown('<Quiz id="q" question="{alert(document.cookie)}" answer="1" />');
		expect(segments).toEqual([{ kind: 'widget', name: 'Quiz', props: { id: 'q', question: '{alert(document.cookie)}', answer: '1' } }]);
	});

	it('drops event handler attributes, whatever their case', async () => {
		const { segments, problems } = await renderLessonMarkdown('<StopLadder onclick="alert(1)" OnMouseOver=\'alert(2)\' onload={alert} aperture="8" />');
		expect(segments).toEqual([{ kind: 'widget', name: 'StopLadder', props: { aperture: '8' } }]);
		expect(problems.filter((p) => /event handler/.test(p))).toHaveLength(2);
	});

	it('drops attributes a widget does not take', async () => {
		const { segments } = await renderLessonMarkdown('<SyncGate shutter="1/1000" class="x" style="color:red" bind:this="x" />');
		expect(segments).toEqual([{ kind: 'widget', name: 'SyncGate', props: { shutter: '1/1000' } }]);
	});

	it('refuses a widget holding content, so nothing inside it runs', async () => {
		const { segments, problems } = await renderLessonMarkdown('<Quiz id="q" answer="1"><script>alert(1)</script></Quiz>');
		expect(findDanger(htmlOf(segments))).toEqual([]);
		expect(widgetsOf(segments)).toEqual([]);
		expect(problems.join()).toMatch(/cannot hold content|left out/);
	});

	it('refuses an unknown component and names it', async () => {
		const { segments, problems } = await renderLessonMarkdown('<Evil foo="bar" />\n\n<Component />');
		expect(segments).toEqual([]);
		expect(problems).toEqual([expect.stringMatching(/<Evil> is not a lesson widget/), expect.stringMatching(/<Component> is not a lesson widget/)]);
	});

	it('only ever produces allow-listed widgets with allow-listed string props', async () => {
		const { segments } = await renderLessonMarkdown(
			['<GelMixer gel="full-cto" onerror="x" />', '<LightPlan preset=rembrandt data-x="1" />', '<Quiz id=\'a\' question="5 &gt; 4?" answer="1" />'].join('\n')
		);
		for (const s of widgetsOf(segments)) {
			if (s.kind !== 'widget') continue;
			const allowed: readonly string[] = WIDGET_ATTRIBUTES[s.name];
			for (const [key, value] of Object.entries(s.props)) {
				expect(allowed).toContain(key);
				expect(typeof value).toBe('string');
			}
		}
		expect(segments.map((s) => (s.kind === 'widget' ? s.props : null))).toEqual([
			{ gel: 'full-cto' },
			{ preset: 'rembrandt' },
			{ id: 'a', question: '5 > 4?', answer: '1' }
		]);
	});
});
