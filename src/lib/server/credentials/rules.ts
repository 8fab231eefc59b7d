// An author's certificate rules per course: which Assignments count and how many of them must be passed.
import { and, asc, eq, inArray } from 'drizzle-orm';
import { db } from '../db';
import { assignments, courses, credentialRules, lessons, modules } from '../db/schema';
import { recordAudit, type Actor } from '../audit';

export async function listRules() {
	const rows = await db
		.select({
			courseId: courses.id,
			courseSlug: courses.slug,
			courseTitle: courses.title,
			minimum: credentialRules.minimumPassed,
			assignmentId: assignments.id,
			assignmentTitle: assignments.title,
			lessonTitle: lessons.title,
			counts: assignments.countsForCredential
		})
		.from(courses)
		.leftJoin(credentialRules, eq(credentialRules.courseId, courses.id))
		.innerJoin(modules, eq(modules.courseId, courses.id))
		.innerJoin(lessons, eq(lessons.moduleId, modules.id))
		.innerJoin(assignments, eq(assignments.lessonId, lessons.id))
		.orderBy(asc(courses.title), asc(modules.position), asc(lessons.position), asc(assignments.position));
	const byCourse = new Map<string, { slug: string; title: string; minimum: number | null; assignments: { id: number; title: string; lesson: string; counts: boolean }[] }>();
	for (const r of rows) {
		const course = byCourse.get(r.courseSlug) ?? { slug: r.courseSlug, title: r.courseTitle, minimum: r.minimum, assignments: [] };
		course.assignments.push({ id: r.assignmentId, title: r.assignmentTitle, lesson: r.lessonTitle, counts: r.counts });
		byCourse.set(r.courseSlug, course);
	}
	return [...byCourse.values()];
}

export type SaveRulesResult = { ok: true; message: string } | { ok: false; field: 'course' | 'counted' | 'minimum'; message: string };

/** Stores the course's rules: the Assignments ticked count, the others do not; the minimum (none: all counted). */
export async function saveRules(author: Actor, courseSlug: string, counted: number[], minimum: number | undefined): Promise<SaveRulesResult> {
	return db.transaction(async (tx) => {
		const [course] = await tx.select({ id: courses.id, title: courses.title }).from(courses).where(eq(courses.slug, courseSlug)).limit(1);
		if (!course) return { ok: false, field: 'course', message: 'There is no such course.' };
		const own = await tx
			.select({ id: assignments.id })
			.from(assignments)
			.innerJoin(lessons, eq(assignments.lessonId, lessons.id))
			.innerJoin(modules, eq(lessons.moduleId, modules.id))
			.where(eq(modules.courseId, course.id));
		const ownIds = own.map((a) => a.id);
		const chosen = [...new Set(counted)];
		if (chosen.some((id) => !ownIds.includes(id))) return { ok: false, field: 'counted', message: 'Tick only Assignments of this course.' };
		if (minimum !== undefined && minimum > chosen.length) {
			return { ok: false, field: 'minimum', message: `The minimum cannot be more than the ${chosen.length} Assignments that count.` };
		}
		if (ownIds.length) {
			await tx.update(assignments).set({ countsForCredential: false }).where(inArray(assignments.id, ownIds));
			if (chosen.length) await tx.update(assignments).set({ countsForCredential: true }).where(and(inArray(assignments.id, chosen)));
		}
		await tx
			.insert(credentialRules)
			.values({ courseId: course.id, minimumPassed: minimum ?? null })
			.onConflictDoUpdate({ target: credentialRules.courseId, set: { minimumPassed: minimum ?? null, updatedAt: new Date() } });
		const detail = `${chosen.length} of ${ownIds.length} Assignments count; ${minimum === undefined ? 'all of them' : minimum} to pass`;
		await recordAudit(tx, author, { action: 'credential.rules', subject: course.title, detail, href: '/author/certificates' });
		return { ok: true, message: `Saved: ${detail}.` };
	});
}
