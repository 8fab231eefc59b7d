// A lesson's Markdown: its published body (a database lesson) or its file in content/ without the frontmatter.
import { readFile } from 'node:fs/promises';
import { join, relative, resolve, sep } from 'node:path';

/** What a lesson's text is read from. */
export type LessonSourceRef = { source: 'file' | 'db'; body: string | null; contentPath: string | null };

/** The text learners read: the published body, or for a file lesson the file's Markdown; null when unreadable. */
export async function readLessonSource(lesson: LessonSourceRef): Promise<string | null> {
	if (lesson.source === 'db') return lesson.body ?? '';
	return lesson.contentPath ? readLessonFileBody(lesson.contentPath) : null;
}

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
