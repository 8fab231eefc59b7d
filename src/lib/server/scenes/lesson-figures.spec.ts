// Every lesson of the course files shows at least one of our own pictures, named from the catalogue, with alt text and a caption.
import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { illustration } from '../../illustrations/index';
import { readWidgetTag, TAG_START } from '../authoring/widget-tag';

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

describe('lesson figures', () => {
	it('gives every lesson at least one figure that exists, with alt text and a caption', async () => {
		const files = await lessonFiles();
		expect(files.length).toBeGreaterThan(0);
		for (const file of files) {
			const lines = (await readFile(file, 'utf8')).split('\n');
			const figures = lines
				.map((line, i) => ({ line, i }))
				.filter(({ line }) => TAG_START.exec(line)?.[1] === 'Figure')
				.map(({ i }) => readWidgetTag(lines.slice(i).join('\n'), i + 1));
			expect(figures.length, file).toBeGreaterThan(0);
			for (const tag of figures) {
				expect(tag.kind, `${file}: ${tag.problems.join('; ')}`).toBe('widget');
				if (tag.kind !== 'widget') continue;
				expect(illustration(tag.props.name), `${file}: ${tag.props.name}`).not.toBeNull();
				expect(tag.props.alt?.trim().length ?? 0, file).toBeGreaterThan(20);
				expect(tag.props.caption?.trim().length ?? 0, file).toBeGreaterThan(0);
			}
		}
	});
});
