// Reads the course files in content/ (course.json + lessons/*.svx frontmatter) and validates them.
import { readFile, readdir } from 'node:fs/promises';
import { join, relative } from 'node:path';
import { compile } from 'mdsvex';
import { z } from 'zod';
import { SAFETY_TOPICS } from '../../safety-topics';
import { assignmentSpecSchema } from '../grading/index';
import { assertSafetyTopics } from './safety-check';

const moduleSchema = z.object({
	slug: z.string().regex(/^[a-z0-9-]+$/),
	title: z.string().min(1),
	summary: z.string().default('')
});

const courseSchema = z.object({
	slug: z.string().regex(/^[a-z0-9-]+$/),
	title: z.string().min(1),
	summary: z.string().min(1),
	instructor: z.string().min(1),
	priceCents: z.number().int().nonnegative(),
	currency: z.string().length(3),
	modules: z.array(moduleSchema).min(1)
});

const assignmentSchema = z.object({
	slug: z.string().regex(/^[a-z0-9-]+$/),
	title: z.string().min(1),
	brief: z.string().min(1),
	spec: assignmentSpecSchema
});

export const lessonFrontmatterSchema = z.object({
	title: z.string().min(1),
	module: z.string().min(1),
	order: z.number().int().positive(),
	summary: z.string().min(1),
	preview: z.boolean().default(false),
	minutes: z.number().int().positive(),
	assignments: z.array(assignmentSchema).default([]),
	/** Cautions the lesson must carry in a Safety note, because it sends people near athletes, water, heights or weather. */
	safety: z.array(z.enum(SAFETY_TOPICS)).default([])
});

export type CourseFile = z.infer<typeof courseSchema>;
export type LessonFile = z.infer<typeof lessonFrontmatterSchema> & {
	slug: string;
	/** path relative to the project root, e.g. content/daylight-flash-for-action/lessons/01-what-a-stop-is.svx */
	contentPath: string;
};
export type CatalogueCourse = CourseFile & { lessons: LessonFile[] };

/** Numeric prefixes order the files and are stripped from the slug: `03-open-shade.svx` → `open-shade`. */
export function slugFromFile(file: string): string {
	return file.replace(/\.svx$/, '').replace(/^\d+-/, '');
}

export async function readCatalogue(root = process.cwd()): Promise<CatalogueCourse[]> {
	const contentDir = join(root, 'content');
	const courses: CatalogueCourse[] = [];
	for (const entry of (await readdir(contentDir, { withFileTypes: true })).filter((e) => e.isDirectory())) {
		const courseDir = join(contentDir, entry.name);
		const coursePath = join(courseDir, 'course.json');
		const course = parseOrThrow(courseSchema, JSON.parse(await readFile(coursePath, 'utf8')), coursePath);
		const lessons: LessonFile[] = [];
		const lessonDir = join(courseDir, 'lessons');
		for (const file of (await readdir(lessonDir)).filter((f) => f.endsWith('.svx')).sort()) {
			const path = join(lessonDir, file);
			const source = await readFile(path, 'utf8');
			const compiled = await compile(source, { smartypants: false });
			const fm = (compiled?.data as { fm?: unknown } | undefined)?.fm ?? {};
			const meta = parseOrThrow(lessonFrontmatterSchema, fm, path);
			assertSafetyTopics(path, meta.safety, source);
			if (!course.modules.some((m) => m.slug === meta.module)) {
				throw new Error(`${path}: module "${meta.module}" is not listed in ${coursePath}`);
			}
			lessons.push({ ...meta, slug: slugFromFile(file), contentPath: relative(root, path) });
		}
		courses.push({ ...course, lessons });
	}
	return courses;
}

function parseOrThrow<T>(schema: z.ZodType<T>, value: unknown, path: string): T {
	const result = schema.safeParse(value);
	if (!result.success) throw new Error(`${path}: ${z.prettifyError(result.error)}`);
	return result.data;
}
