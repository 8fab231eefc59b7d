// Test helpers for the demo course's structure.
import { and, eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { courses, modules } from '$lib/server/db/schema';

/** The id of a module of a course, both by slug (the demo's "Bringing your own light" by default). */
export async function moduleIdOf(courseSlug: string, moduleSlug = 'bringing-your-own-light'): Promise<number> {
	const [mod] = await db
		.select({ id: modules.id })
		.from(modules)
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(and(eq(courses.slug, courseSlug), eq(modules.slug, moduleSlug)));
	return mod.id;
}
