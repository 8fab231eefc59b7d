// The register of issued certificates: the admin's list, revoking one (with its audit line), and a learner's own.
import { and, desc, eq, isNull, sql } from 'drizzle-orm';
import { db } from '../db';
import { courses, issuedCredentials, users } from '../db/schema';
import { recordAudit, type Actor } from '../audit';
import { courseStanding } from './eligibility';

export const REGISTER_PAGE_SIZE = 200;

/** The newest certificates first, with who holds them and for which course. */
export async function listIssued() {
	return db
		.select({
			id: issuedCredentials.id,
			issuedAt: issuedCredentials.issuedAt,
			revokedAt: issuedCredentials.revokedAt,
			revokedReason: issuedCredentials.revokedReason,
			learnerName: users.name,
			learnerEmail: users.email,
			courseTitle: courses.title
		})
		.from(issuedCredentials)
		.innerJoin(users, eq(issuedCredentials.userId, users.id))
		.innerJoin(courses, eq(issuedCredentials.courseId, courses.id))
		.orderBy(desc(issuedCredentials.issuedAt), desc(issuedCredentials.id))
		.limit(REGISTER_PAGE_SIZE);
}

export type RevokeResult = { ok: true; message: string } | { ok: false; message: string };

/** Withdraws a certificate: the verification page says "revoked" from now on. Revoking twice changes nothing. */
export async function revokeCredential(admin: Actor, id: string, reason: string): Promise<RevokeResult> {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.update(issuedCredentials)
			.set({ revokedAt: new Date(), revokedReason: reason })
			.where(and(eq(issuedCredentials.id, id), isNull(issuedCredentials.revokedAt)))
			.returning({ userId: issuedCredentials.userId, courseId: issuedCredentials.courseId });
		if (!row) {
			const [exists] = await tx.select({ id: issuedCredentials.id }).from(issuedCredentials).where(eq(issuedCredentials.id, id)).limit(1);
			return { ok: false, message: exists ? 'That certificate was already revoked.' : 'There is no such certificate.' };
		}
		const [who] = await tx
			.select({ email: users.email, course: courses.title })
			.from(users)
			.innerJoin(courses, eq(courses.id, row.courseId))
			.where(eq(users.id, row.userId));
		await recordAudit(tx, admin, {
			action: 'credential.revoke',
			subject: `${who.email} in ${who.course}`,
			detail: `certificate ${id}`,
			reason,
			href: `/verify/credential/${id}`
		});
		return { ok: true, message: `Revoked the certificate of ${who.email}.` };
	});
}

/** A certificate for its holder or an admin; null for anyone else and for a missing one alike. */
export async function credentialFor(user: { id: string; roles: readonly string[] }, id: string) {
	const [row] = await db
		.select({
			id: issuedCredentials.id,
			userId: issuedCredentials.userId,
			jwt: issuedCredentials.jwt,
			issuedAt: issuedCredentials.issuedAt,
			revokedAt: issuedCredentials.revokedAt,
			courseSlug: courses.slug
		})
		.from(issuedCredentials)
		.innerJoin(courses, eq(issuedCredentials.courseId, courses.id))
		.where(eq(issuedCredentials.id, id))
		.limit(1);
	if (!row || (row.userId !== user.id && !user.roles.includes('admin'))) return null;
	return row;
}

/** The learner's certificate panel: for each course they have started, where they stand and the certificate if issued. */
export async function certificatePanel(userId: string) {
	const started = await db
		.selectDistinct({ slug: courses.slug })
		.from(courses)
		.where(
			sql`${courses.published} and exists (select 1 from lesson_progress lp join lessons l on l.id = lp.lesson_id join modules m on m.id = l.module_id where lp.user_id = ${userId} and m.course_id = ${courses.id})`
		);
	const panels = await Promise.all(
		started.map(async ({ slug }) => {
			const standing = await courseStanding(userId, slug);
			if (!standing) return null;
			const [issued] = await db
				.select({ id: issuedCredentials.id, issuedAt: issuedCredentials.issuedAt, revokedAt: issuedCredentials.revokedAt })
				.from(issuedCredentials)
				.where(and(eq(issuedCredentials.userId, userId), eq(issuedCredentials.courseId, standing.courseId)))
				.limit(1);
			return {
				course: { slug: standing.courseSlug, title: standing.courseTitle },
				lessons: standing.lessons,
				passed: standing.counted.filter((a) => a.passed).length,
				counted: standing.counted.length,
				required: standing.required,
				eligible: standing.eligible,
				issued: issued ? { id: issued.id, issuedAt: issued.issuedAt.toISOString(), revokedAt: issued.revokedAt?.toISOString() ?? null } : null
			};
		})
	);
	return panels.filter((p) => p !== null);
}
