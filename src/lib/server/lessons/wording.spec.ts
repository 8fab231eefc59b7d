// Names and labels we replaced stay gone: greps the product's text (src, content, scripts, static and the two guides).
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = process.cwd();
const SCANNED = ['src', 'content', 'scripts', 'static', 'README.md', 'DEVELOPERS.md'];
const TEXT = /\.(ts|js|mjs|cjs|svelte|svx|md|json|css|html|svg|txt)$/;
const THIS_FILE = relative(ROOT, new URL(import.meta.url).pathname);

/** Each replaced wording, why it went, and what says it now. Matched case-insensitively, spacing-insensitively. */
const RETIRED: { words: string; why: string }[] = [
	{ words: 'mark complete', why: 'a label from other course products; ours is "I\'ve finished this lesson"' },
	{ words: 'free preview', why: 'ours is "open lesson"' },
	{ words: 'min read', why: 'a blogging label; ours is "about N minutes"' },
	{ words: 'most compatible', why: 'a phone setting name; HEIC is decoded, so no phone setting needs changing' },
	{ words: 'set your phone to save', why: 'HEIC frames are decoded and measured; nobody is asked to change phone settings' },
	{ words: 'camera raw', why: 'ours is "raw files"' },
	{ words: 'frisbee', why: 'a trademarked toy name; the sport is "ultimate", the object a "disc"' },
	{ words: 'priya natarajan', why: 'the name of a well-known living scientist; the demo admin has an invented name now' },
	{ words: 'marco ibáñez', why: 'too ordinary a name to be safely invented; the demo author has another' },
	{ words: 'a few feet from', why: 'the landing page says "a couple of metres from the athlete\'s line"' },
	{ words: 'count the clicks', why: 'one fixed recipe; lesson 06 teaches the range and the reasons' },
	{ words: 'one to two and a third stops under', why: 'one fixed recipe; lesson 06 teaches the range and the reasons' },
	{ words: 'anyone jogging past', why: 'only people who agreed are lit' }
];

function* files(path: string): Generator<string> {
	const full = join(ROOT, path);
	if (statSync(full).isDirectory()) {
		for (const entry of readdirSync(full)) yield* files(join(path, entry));
	} else if (TEXT.test(path) && path !== THIS_FILE) {
		yield path;
	}
}

const pattern = (words: string) => new RegExp(words.split(' ').join('\\s+'), 'i');

describe('product wording', () => {
	const scanned = SCANNED.flatMap((p) => [...files(p)]);

	it('scans the lessons, the pages and the demo accounts (guards the walk itself)', () => {
		expect(scanned).toContain('scripts/demo-accounts.json');
		expect(scanned).toContain('src/routes/(public)/+page.svelte');
		expect(scanned.filter((p) => p.endsWith('.svx')).length).toBeGreaterThanOrEqual(17);
	});

	it.each(RETIRED)('no "$words" anywhere ($why)', ({ words }) => {
		const re = pattern(words);
		const hits = scanned.filter((path) => re.test(readFileSync(join(ROOT, path), 'utf8')));
		expect(hits).toEqual([]);
	});

	it('matches across a line break, as Markdown wraps it', () => {
		expect(pattern('count the clicks').test('then count the\n  clicks')).toBe(true);
	});
});
