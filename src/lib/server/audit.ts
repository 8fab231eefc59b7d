// The audit log: writing one line per consequential action, and reading it back filtered, a page at a time or as CSV.
import { and, count, desc, eq, gte, ilike, lt, or, type SQL } from 'drizzle-orm';
import { stringify } from 'csv-stringify/sync';
import { z } from 'zod';
import { db, type Db } from './db';
import { auditActions, auditLog, type AuditAction } from './db/schema';

type Runner = Db | Parameters<Parameters<Db['transaction']>[0]>[0];

export interface Actor {
	id: string;
	email: string;
}

export interface AuditInput {
	action: AuditAction;
	subject: string;
	detail?: string;
	reason?: string;
	href?: string | null;
}

/** Names of the actions as admins read them, in the filter and the CSV. */
export const AUDIT_ACTION_LABELS: Record<AuditAction, string> = {
	'role.change': 'Roles changed',
	'payment.refund': 'Payment refunded',
	'enrolment.grant': 'Enrolled by hand',
	'enrolment.revoke': 'Access revoked',
	'enrolment.restore': 'Access restored',
	'verdict.override': 'Verdict changed',
	'lesson.publish': 'Lesson published',
	'lesson.restore': 'Lesson version restored',
	'coupon.create': 'Coupon created',
	'coupon.change': 'Coupon changed',
	'plan.approve': 'Shoot Plan approved',
	'plan.return': 'Shoot Plan sent back',
	'credential.revoke': 'Certificate revoked',
	'credential.rules': 'Certificate rules changed',
	'field-day.schedule': 'Field day scheduled',
	'field-day.change': 'Field day changed',
	'field-day.call-off': 'Field day called off',
	'cohort.create': 'Cohort made',
	'cohort.members': 'Cohort members changed',
	'cohort.due-dates': 'Cohort due date set'
};

/**
 * Writes one line. Pass the transaction that makes the change, so the change never lands without its line;
 * an action done at an outside service first (a refund) is recorded once it has succeeded.
 */
export async function recordAudit(runner: Runner, actor: Actor, entry: AuditInput): Promise<void> {
	await runner.insert(auditLog).values({
		actorUserId: actor.id,
		actorEmail: actor.email,
		action: entry.action,
		subject: entry.subject.slice(0, 500),
		detail: (entry.detail ?? '').slice(0, 2000),
		reason: (entry.reason ?? '').slice(0, 2000),
		href: entry.href ?? null
	});
}

export const auditPageSize = 50;
// a CSV export holds at most this many lines; filters narrow it
export const AUDIT_EXPORT_LIMIT = 50_000;

const day = z
	.string()
	.regex(/^\d{4}-\d{2}-\d{2}$/)
	.refine((s) => {
		const t = Date.parse(`${s}T00:00:00Z`);
		return !Number.isNaN(t) && new Date(t).toISOString().slice(0, 10) === s;
	})
	.catch('');

/** URL params of the audit page; anything malformed falls back to "no filter". */
export const auditQuerySchema = z.object({
	action: z.enum(auditActions).or(z.literal('')).catch(''),
	q: z.string().trim().max(100).catch(''),
	from: day,
	to: day,
	page: z.coerce.number().int().min(1).max(100_000).catch(1)
});
export type AuditQuery = z.infer<typeof auditQuerySchema>;

export function readAuditQuery(params: URLSearchParams): AuditQuery {
	const pick = (k: string) => params.get(k) ?? undefined;
	return auditQuerySchema.parse({ action: pick('action'), q: pick('q'), from: pick('from'), to: pick('to'), page: pick('page') });
}

function escapeLike(s: string): string {
	return s.replace(/[\\%_]/g, (c) => `\\${c}`);
}

function whereOf(query: AuditQuery): SQL | undefined {
	const filters: SQL[] = [];
	if (query.action) filters.push(eq(auditLog.action, query.action));
	if (query.q) {
		const like = `%${escapeLike(query.q)}%`;
		filters.push(or(ilike(auditLog.actorEmail, like), ilike(auditLog.subject, like), ilike(auditLog.detail, like), ilike(auditLog.reason, like))!);
	}
	if (query.from) filters.push(gte(auditLog.at, new Date(`${query.from}T00:00:00Z`)));
	// "to" is a whole day (UTC)
	if (query.to) filters.push(lt(auditLog.at, new Date(Date.parse(`${query.to}T00:00:00Z`) + 86_400_000)));
	return and(...filters);
}

const columns = {
	id: auditLog.id,
	at: auditLog.at,
	actorEmail: auditLog.actorEmail,
	action: auditLog.action,
	subject: auditLog.subject,
	detail: auditLog.detail,
	reason: auditLog.reason,
	href: auditLog.href
};

export async function listAudit(query: AuditQuery) {
	const where = whereOf(query);
	const [entries, [{ total }]] = await Promise.all([
		db
			.select(columns)
			.from(auditLog)
			.where(where)
			.orderBy(desc(auditLog.at), desc(auditLog.id))
			.limit(auditPageSize)
			.offset((query.page - 1) * auditPageSize),
		db.select({ total: count() }).from(auditLog).where(where)
	]);
	return { entries, total, pages: Math.max(1, Math.ceil(total / auditPageSize)) };
}

/**
 * The filtered log as CSV (newest first, UTC ISO times). Cells that a spreadsheet would run as a formula
 * (=, +, -, @) are escaped: the subject and reason are typed by people.
 */
export async function auditCsv(query: AuditQuery): Promise<string> {
	const rows = await db.select(columns).from(auditLog).where(whereOf(query)).orderBy(desc(auditLog.at), desc(auditLog.id)).limit(AUDIT_EXPORT_LIMIT);
	return stringify(
		rows.map((r) => [r.at.toISOString(), r.actorEmail, r.action, AUDIT_ACTION_LABELS[r.action], r.subject, r.detail, r.reason]),
		{ header: true, columns: ['when_utc', 'who', 'action', 'action_label', 'subject', 'what', 'why'], escape_formulas: true, record_delimiter: 'windows' }
	);
}
