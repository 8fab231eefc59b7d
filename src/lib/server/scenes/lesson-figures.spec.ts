// Every lesson of the course files shows at least one of our own pictures, named from the catalogue, with alt text and a caption.
import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { illustration } from '../../illustrations/index';

const contentDir = join(process.cwd(), 'content');

async function lessonFiles(): Promise<string[]> {
	const files: string[] = [];
	for (const course of await readdir(contentDir, { withFileTypes: true })) {
		if (!course.isDirectory()) continue;
		const dir = join(contentDir, course.name, 'lessons');
		for (const f of (await readdir(dir)).filter((f) => f.endsWith('.svx'))) files.push(join(dir, f));
	}
	return files;
}

/** The attributes of each `<Figure … />` line; whether the tag itself is well formed is the lesson renderer's own check. */
function figureTags(source: string): Record<string, string>[] {
	return source
		.split('\n')
		.filter((line) => /^<Figure\s/.test(line))
		.map((line) => Object.fromEntries([...line.matchAll(/([a-z]+)="([^"]*)"/g)].map((m) => [m[1], m[2]])));
}

describe('lesson figures', () => {
	it('gives every lesson at least one figure that exists, with alt text and a caption', async () => {
		const files = await lessonFiles();
		expect(files.length).toBeGreaterThan(0);
		for (const file of files) {
			const figures = figureTags(await readFile(file, 'utf8'));
			expect(figures.length, file).toBeGreaterThan(0);
			for (const props of figures) {
				expect(illustration(props.name ?? ''), `${file}: ${props.name}`).not.toBeNull();
				expect(props.alt?.trim().length ?? 0, file).toBeGreaterThan(20);
				expect(props.caption?.trim().length ?? 0, file).toBeGreaterThan(0);
			}
		}
	});
});
