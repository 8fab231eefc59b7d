// Test helpers for attempts: enrolment by direct insert, frame pairs made with sharp + Exif, upload events, clean-up.
import { and, eq, inArray } from 'drizzle-orm';
import type { RequestEvent } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { attempts, courses, enrolments } from '$lib/server/db/schema';
import { fileStore } from '$lib/server/storage';
import { attemptFolder } from '$lib/server/attempts/keys';
import { makeFrame, REFERENCE_EXIF } from '$lib/server/analysis/test-frames';
import { makeEvent, type TestCookies } from './request-event';
import { GRADE_QUEUE, openQueue } from '$lib/server/attempts/queue';
import { gradeAttempt } from '$lib/server/attempts/grade-job';
import { submitAttempt } from '$lib/server/attempts/submit';
import { readUploadForm } from '$lib/server/attempts/upload-form';

export const COURSE = 'daylight-flash-for-action';
/** Lesson 09's assignment: a reference frame, then a lit frame 1½ ± ½ stops under with the subject relit. */
export const ASSIGNMENT = 'off-the-axis';
export const LESSON = 'off-the-axis';

/** Paid access, as engineer C's checkout would grant it, by a direct insert (source 'admin'). */
export async function enrol(userId: string, courseSlug = COURSE): Promise<void> {
	const course = await db.query.courses.findFirst({ where: eq(courses.slug, courseSlug) });
	if (!course) throw new Error(`no course ${courseSlug}`);
	await db.insert(enrolments).values({ userId, courseId: course.id, source: 'admin' }).onConflictDoNothing();
}

export async function unenrol(userId: string, courseSlug = COURSE): Promise<void> {
	const course = await db.query.courses.findFirst({ where: eq(courses.slug, courseSlug) });
	if (course) await db.delete(enrolments).where(and(eq(enrolments.userId, userId), eq(enrolments.courseId, course.id)));
}

const FLASH_FIRED = 0x19; // CIPA DC-008: fired, auto mode

/**
 * A pair for `off-the-axis` that passes: reference at 1/500 s f/8 ISO 100 (REFERENCE_EXIF), lit at 1/1500 s,
 * log2(1500/500) = 1.58 stops under (APEX, ASA PH2.5-1960); the background drops by as much, the flash
 * holds the subject at mid-grey, so the subject stands 1.1 stops over the background.
 */
export async function passingPair(size = { width: 600, height: 400 }, personal = false) {
	const drop = Math.log2(1500 / 500);
	const reference = await makeFrame({ ...size, subject: { stops: 0 }, background: { stops: 0.5 }, exif: { ...REFERENCE_EXIF, personal } });
	const lit = await makeFrame({
		...size,
		subject: { stops: 0 },
		background: { stops: 0.5 - drop },
		exif: { ...REFERENCE_EXIF, exposureTime: 1 / 1500, flash: FLASH_FIRED, personal }
	});
	return { reference, lit };
}

export function uploadData(
	fields: {
		assignment?: string;
		submissionKey?: string;
		subjectBox?: string;
		lightPlan?: string;
		subjectSpeed?: string;
		subjectDistance?: string;
		flashGn?: string;
		flashPower?: string;
		flashDistance?: string;
	},
	files: Record<string, Buffer | Blob>): FormData {
	const data = new FormData();
	for (const [k, v] of Object.entries(fields)) if (v !== undefined) data.append(k, v);
	for (const [name, bytes] of Object.entries(files)) {
		const blob = bytes instanceof Blob ? bytes : new Blob([new Uint8Array(bytes)], { type: 'image/jpeg' });
		data.append(`frame:${name}`, blob, `${name}.jpg`);
	}
	return data;
}

/** A POST request event carrying a multipart body (makeEvent builds only text forms). */
export function multipartEvent(path: string, data: FormData | string, cookies?: TestCookies, headers: Record<string, string> = {}): RequestEvent {
	const event = makeEvent({ method: 'POST', path, cookies, headers });
	const url = new URL(path, event.url.origin);
	(event as { request: Request }).request = new Request(url, { method: 'POST', body: data, headers: { origin: url.origin, ...headers } });
	return event;
}

/** Deletes the attempts (rows cascade) and their files. */
export async function removeAttempts(ids: string[]): Promise<void> {
	if (ids.length === 0) return;
	await db.delete(attempts).where(inArray(attempts.id, ids));
	await Promise.all(ids.map((id) => fileStore().deletePrefix(attemptFolder(id))));
}

export async function attemptIdsOf(userId: string): Promise<string[]> {
	return (await db.select({ id: attempts.id }).from(attempts).where(eq(attempts.userId, userId))).map((r) => r.id);
}

export const key = () => `test-${Math.random().toString(36).slice(2, 12)}`;

/** An attempt of ASSIGNMENT with a passing pair, submitted as the upload route does and graded here (its queued job removed). */
export async function gradedAttemptOf(userId: string): Promise<string> {
	const form = readUploadForm(uploadData({ assignment: ASSIGNMENT, submissionKey: key() }, await passingPair()));
	if (!form.ok) throw new Error(form.message);
	const made = await submitAttempt({ id: userId, roles: ['learner'] }, form.form);
	if (made.kind !== 'created') throw new Error(made.kind);
	await (await openQueue()).deleteJob(GRADE_QUEUE, made.id);
	if ((await gradeAttempt(made.id)) !== 'graded') throw new Error(`attempt ${made.id} was not graded`);
	return made.id;
}
