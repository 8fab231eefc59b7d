// Editing an Assignment in the browser: its spec is validated (errors located by path) and described in plain words.
import { and, eq, max } from 'drizzle-orm';
import { db } from '../db';
import { assignments, courses, lessons, modules } from '../db/schema';
import { describeCriterion, parseSpecText, rubricFor, type SpecError } from '../grading';
import { ensureDbLesson } from './versions';

export type SpecCheck = { errors: SpecError[]; criteria: string[]; frames: string[]; rubric: { id: string; label: string }[] };

/**
 * Checks spec text as typed: the errors (empty when valid) and, for whatever criteria can be read, their
 * plain-words description, so the author sees what learners will be told while still fixing the rest.
 */
export function checkSpecText(text: string): SpecCheck {
	const result = parseSpecText(text);
	let loose: { criteria?: unknown; frames?: unknown; rubric?: unknown } = {};
	try {
		const parsed: unknown = JSON.parse(text);
		if (parsed && typeof parsed === 'object') loose = parsed;
	} catch {
		// the JSON error is already in result.errors
	}
	const spec = result.ok ? result.spec : null;
	const criteria = spec ? spec.criteria : Array.isArray(loose.criteria) ? loose.criteria : [];
	const frames = spec ? spec.frames : Array.isArray(loose.frames) ? loose.frames.filter((f): f is string => typeof f === 'string') : [];
	const kinds = criteria.filter((c): c is { kind: string } => !!c && typeof c === 'object' && typeof (c as { kind?: unknown }).kind === 'string');
	const rubric = spec ? rubricFor(spec) : rubricFor({ criteria: kinds, rubric: Array.isArray(loose.rubric) ? loose.rubric.map(String) : undefined });
	return {
		errors: result.ok ? [] : result.errors,
		criteria: criteria.map((c) => describeCriterion(c as Parameters<typeof describeCriterion>[0])),
		frames,
		rubric: rubric.map(({ id, label }) => ({ id, label }))
	};
}

/** The assignment with the lesson and course it belongs to. */
export async function openAssignment(assignmentId: number) {
	const [row] = await db
		.select({ assignment: assignments, lesson: lessons, course: courses })
		.from(assignments)
		.innerJoin(lessons, eq(assignments.lessonId, lessons.id))
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(eq(assignments.id, assignmentId))
		.limit(1);
	return row ?? null;
}

export type AssignmentSave =
	| { ok: true; assignmentId: number; message: string }
	| { ok: false; message: string; field?: string; specErrors?: SpecError[] };

type Fields = { title: string; brief: string; spec: string };

/** Saves title, brief and spec; an invalid spec stores nothing and returns its located errors. */
export async function saveAssignment(assignmentId: number, authorId: string, input: Fields): Promise<AssignmentSave> {
	const checked = parseSpecText(input.spec);
	if (!checked.ok) return { ok: false, field: 'spec', message: 'The spec has problems: nothing was saved.', specErrors: checked.errors };
	return db.transaction(async (tx) => {
		const [row] = await tx.select().from(assignments).where(eq(assignments.id, assignmentId)).for('update');
		if (!row) return { ok: false, message: 'That assignment no longer exists.' };
		const [lesson] = await tx.select().from(lessons).where(eq(lessons.id, row.lessonId)).for('update');
		// the seed rewrites the assignments of file lessons: an edited one makes its lesson a database lesson
		const moved = await ensureDbLesson(tx, lesson, authorId);
		if (!moved.ok) return moved;
		await tx.update(assignments).set({ title: input.title, brief: input.brief, spec: checked.spec }).where(eq(assignments.id, assignmentId));
		return { ok: true, assignmentId, message: 'Assignment saved. New attempts are graded against this spec; earlier ones keep theirs.' };
	});
}

/** A new assignment at the end of a lesson's list (show it with <AssignmentCard slug="…" />). */
export async function createAssignment(lessonId: number, authorId: string, input: Fields & { slug: string }): Promise<AssignmentSave> {
	const checked = parseSpecText(input.spec);
	if (!checked.ok) return { ok: false, field: 'spec', message: 'The spec has problems: nothing was saved.', specErrors: checked.errors };
	return db.transaction(async (tx) => {
		const [lesson] = await tx.select().from(lessons).where(eq(lessons.id, lessonId)).for('update');
		if (!lesson) return { ok: false, message: 'That lesson no longer exists.' };
		const [clash] = await tx.select({ id: assignments.id }).from(assignments).where(eq(assignments.slug, input.slug)).limit(1);
		if (clash) return { ok: false, field: 'slug', message: 'Another assignment already has that slug.' };
		const moved = await ensureDbLesson(tx, lesson, authorId);
		if (!moved.ok) return moved;
		const [{ last }] = await tx.select({ last: max(assignments.position) }).from(assignments).where(and(eq(assignments.lessonId, lessonId)));
		const [created] = await tx
			.insert(assignments)
			.values({ lessonId, slug: input.slug, title: input.title, brief: input.brief, spec: checked.spec, position: (last ?? -1) + 1 })
			.returning({ id: assignments.id });
		return { ok: true, assignmentId: created.id, message: `Assignment created. Add <AssignmentCard slug="${input.slug}" /> to the lesson to show it.` };
	});
}
