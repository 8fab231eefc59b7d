// The course index: the real course files load, every lesson that names a caution carries it, and a broken file is named.
import { mkdtemp, mkdir, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { readCatalogue } from './catalogue';
import { safetyTopicsIn } from './safety-check';
import { readFileSync } from 'node:fs';

const COURSE = { slug: 'c', title: 'C', summary: 'S', instructor: 'I (invented)', priceCents: 100, currency: 'usd', modules: [{ slug: 'm', title: 'M' }] };

let dirs: string[] = [];
afterEach(async () => {
	await Promise.all(dirs.map((d) => rm(d, { recursive: true, force: true })));
	dirs = [];
});

async function courseWith(lessonFile: string, text: string): Promise<string> {
	const root = await mkdtemp(join(tmpdir(), 'stopwise-catalogue-'));
	dirs.push(root);
	await mkdir(join(root, 'content', 'c', 'lessons'), { recursive: true });
	await writeFile(join(root, 'content', 'c', 'course.json'), JSON.stringify(COURSE));
	await writeFile(join(root, 'content', 'c', 'lessons', lessonFile), text);
	return root;
}

const frontmatter = (safety: string) => `---\ntitle: T\nmodule: m\norder: 1\nsummary: S\nminutes: 5\n${safety}---\n\nBody.\n`;

describe('course catalogue', () => {
	it('refuses a lesson that needs a caution it does not carry, naming the file', async () => {
		const root = await courseWith('01-near-the-line.svx', frontmatter('safety: [stands, eyes]\n') + '\n<SafetyNote topics="stands" />\n');
		await expect(readCatalogue(root)).rejects.toThrow(/01-near-the-line\.svx: .*caution eyes/);
	});

	it('refuses an unknown safety topic, naming the file', async () => {
		const root = await courseWith('01-lava.svx', frontmatter('safety: [lava]\n'));
		await expect(readCatalogue(root)).rejects.toThrow(/01-lava\.svx/);
	});

	it('accepts a lesson with no safety field, and one whose notes cover it', async () => {
		const none = await readCatalogue(await courseWith('01-a.svx', frontmatter('')));
		expect(none[0].lessons[0].safety).toEqual([]);
		const covered = await readCatalogue(await courseWith('01-b.svx', frontmatter('safety: [water]\n') + '\n<SafetyNote topics="rain,water" />\n'));
		expect(covered[0].lessons[0].safety).toEqual(['water']);
	});
});

describe('the demo course', () => {
	it('loads, and each lesson that sends people near athletes, water, heights or weather names its cautions', async () => {
		const [course] = await readCatalogue();
		const bySlug = new Map(course.lessons.map((l) => [l.slug, l]));
		// the cautions the course review asked for, lesson by lesson
		const required: Record<string, string[]> = {
			'inverse-square': ['stands', 'eyes'],
			'sync-speed': ['stands', 'eyes'],
			'freezing-action': ['stands', 'eyes'],
			'high-speed-sync': ['eyes', 'flashing', 'heat', 'thunder'],
			'cto-and-a-blue-world': ['eyes', 'flashing', 'heat', 'water'],
			'rembrandt-on-the-move': ['tall-stands', 'flashing', 'heights'],
			'cross-light-and-rim': ['eyes', 'flashing', 'thunder'],
			'planning-the-shoot': ['general', 'stands', 'flashing', 'thunder']
		};
		for (const [slug, topics] of Object.entries(required)) {
			const lesson = bySlug.get(slug);
			expect(lesson, slug).toBeDefined();
			expect(lesson!.safety, slug).toEqual(expect.arrayContaining(topics));
			// readCatalogue already refused any lesson whose notes miss a declared topic; check it independently here
			const shown = safetyTopicsIn(readFileSync(lesson!.contentPath, 'utf8'));
			for (const t of topics) expect(shown.has(t), `${slug} shows ${t}`).toBe(true);
		}
		// every lesson with an assignment sends people out, so it declares at least one caution
		for (const lesson of course.lessons.filter((l) => l.assignments.length > 0)) {
			expect(lesson.safety.length, lesson.slug).toBeGreaterThan(0);
		}
	});
});
