// Admin's enrolment list (filters from URL params) and granting or revoking access by hand.
import { and, count, desc, eq, ilike, sql, type SQL } from 'drizzle-orm';
import { z } from 'zod';
import { db } from '../db';
import { courses, enrolments, users } from '../db/schema';
import { escapeLike } from './admin-payments';
import { activateEnrolment } from './enrolments';
import { recordAudit } from '../audit';

export const enrolmentsPageSize = 25;

export const enrolmentsQuerySchema = z.object({
	status: z.enum(['active', 'revoked', '']).catch(''),
	course: z.string().trim().max(100).catch(''),
	q: z.string().trim().max(100).catch(''),
	page: z.coerce.number().int().min(1).max(100_000).catch(1)
});
export type EnrolmentsQuery = z.infer<typeof enrolmentsQuerySchema>;

export function readEnrolmentsQuery(params: URLSearchParams): EnrolmentsQuery {
	const pick = (k: string) => params.get(k) ?? undefined;
	return enrolmentsQuerySchema.parse({ status: pick('status'), course: pick('course'), q: pick('q'), page: pick('page') });
}

export async function listEnrolments(query: EnrolmentsQuery) {
	const filters: SQL[] = [];
	if (query.status) filters.push(eq(enrolments.status, query.status));
	if (query.course) filters.push(eq(courses.slug, query.course));
	if (query.q) filters.push(ilike(users.email, `%${escapeLike(query.q)}%`));
	const where = and(...filters);
	const [rows, [{ total }], courseList] = await Promise.all([
		db
			.select({
				id: enrolments.id,
				email: users.email,
				name: users.name,
				course: courses.title,
				courseSlug: courses.slug,
				status: enrolments.status,
				source: enrolments.source,
				createdAt: enrolments.createdAt,
				revokedAt: enrolments.revokedAt
			})
			.from(enrolments)
			.innerJoin(users, eq(enrolments.userId, users.id))
			.innerJoin(courses, eq(enrolments.courseId, courses.id))
			.where(where)
			.orderBy(desc(enrolments.createdAt), desc(enrolments.id))
			.limit(enrolmentsPageSize)
			.offset((query.page - 1) * enrolmentsPageSize),
		db
			.select({ total: count() })
			.from(enrolments)
			.innerJoin(users, eq(enrolments.userId, users.id))
			.innerJoin(courses, eq(enrolments.courseId, courses.id))
			.where(where),
		db.select({ slug: courses.slug, title: courses.title }).from(courses).orderBy(courses.title)
	]);
	return { enrolments: rows, total, pages: Math.max(1, Math.ceil(total / enrolmentsPageSize)), courses: courseList };
}

export type ChangeResult = { ok: true; message: string } | { ok: false; message: string };
/** a refused grant names the field that was wrong, so the form shows the message beside it */
export type GrantResult = { ok: true; message: string } | { ok: false; field: 'email' | 'course'; message: string };

type Actor = { id: string; email: string };

/** Opens a course to a person by hand (a scholarship, a mentor's guest); the audit log keeps who did it and why. */
export async function grantEnrolment(actor: Actor, email: string, courseSlug: string, reason = ''): Promise<GrantResult> {
	const [user] = await db.select({ id: users.id, name: users.name }).from(users).where(eq(sql`lower(${users.email})`, email.toLowerCase()));
	if (!user) return { ok: false, field: 'email', message: `Nobody has an account with ${email}.` };
	const course = await db.query.courses.findFirst({ where: eq(courses.slug, courseSlug) });
	if (!course) return { ok: false, field: 'course', message: 'That course does not exist.' };
	await db.transaction(async (tx) => {
		await activateEnrolment(tx, { userId: user.id, courseId: course.id, source: 'admin', paymentId: null });
		await recordAudit(tx, actor, { action: 'enrolment.grant', subject: `${email} in ${course.title}`, reason, href: `/admin/enrolments?q=${encodeURIComponent(email)}` });
	});
	return { ok: true, message: `${user.name} is enrolled in ${course.title}.` };
}

export async function setEnrolmentStatus(actor: Actor, enrolmentId: number, status: 'active' | 'revoked', reason = ''): Promise<ChangeResult> {
	return db.transaction(async (tx) => {
		const rows = await tx
			.update(enrolments)
			// restoring by hand is a grant (no refund closes it); revoking by hand withdraws any grant
			.set(status === 'revoked' ? { status, revokedAt: sql`now()`, grantedAt: null } : { status, revokedAt: null, grantedAt: sql`now()` })
			.where(eq(enrolments.id, enrolmentId))
			.returning({ id: enrolments.id, userId: enrolments.userId, courseId: enrolments.courseId });
		if (!rows[0]) return { ok: false, message: 'That enrolment does not exist.' } as const;
		const [who] = await tx
			.select({ email: users.email, course: courses.title })
			.from(users)
			.innerJoin(courses, eq(courses.id, rows[0].courseId))
			.where(eq(users.id, rows[0].userId));
		await recordAudit(tx, actor, {
			action: status === 'revoked' ? 'enrolment.revoke' : 'enrolment.restore',
			subject: who ? `${who.email} in ${who.course}` : `enrolment ${enrolmentId}`,
			reason,
			href: who ? `/admin/enrolments?q=${encodeURIComponent(who.email)}` : null
		});
		return { ok: true, message: status === 'revoked' ? 'Access revoked.' : 'Access restored.' } as const;
	});
}
