// The Markdown of a lesson file in content/ without its frontmatter: where a lesson edited in the browser starts from.
import { readFile } from 'node:fs/promises';
import { join, relative, resolve, sep } from 'node:path';

/** Drops a leading `---` … `---` YAML block and the blank lines after it. */
export function stripFrontmatter(text: string): string {
	const normalised = text.replace(/\r\n?/g, '\n');
	const match = /^---\n[\s\S]*?\n---[ \t]*(?:\n|$)/.exec(normalised);
	return (match ? normalised.slice(match[0].length) : normalised).replace(/^\n+/, '');
}

/** Reads `content/…/NN-slug.svx` (a path relative to the project root, as stored on the lesson); null when missing. */
export async function readLessonFileBody(contentPath: string, root = process.cwd()): Promise<string | null> {
	const contentDir = resolve(root, 'content');
	const full = resolve(root, contentPath);
	// the path comes from the database: never read outside content/
	if (relative(contentDir, full).startsWith('..') || !full.startsWith(contentDir + sep) || !full.endsWith('.svx')) return null;
	try {
		return stripFrontmatter(await readFile(join(full), 'utf8'));
	} catch {
		return null;
	}
}
