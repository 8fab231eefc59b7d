// Admin's people list (search, sort, pages) and role changes, each written to the role audit log.
import { asc, count, desc, eq, ilike, or, sql, type SQL } from 'drizzle-orm';
import { z } from 'zod';
import { db } from './db';
import { roleAudit, roles, users, type Role } from './db/schema';
import { recordAudit } from './audit';
import { endAllSessions } from './auth';

export const peopleSorts = ['name', 'email', 'created'] as const;
export const pageSize = 20;

/** URL params of the people table; anything malformed falls back to the default instead of failing. */
export const peopleQuerySchema = z.object({
	q: z.string().trim().max(100).catch(''),
	sort: z.enum(peopleSorts).catch('name'),
	dir: z.enum(['asc', 'desc']).catch('asc'),
	page: z.coerce.number().int().min(1).max(100_000).catch(1)
});
export type PeopleQuery = z.infer<typeof peopleQuerySchema>;

export function readPeopleQuery(params: URLSearchParams): PeopleQuery {
	return peopleQuerySchema.parse({
		q: params.get('q') ?? undefined,
		sort: params.get('sort') ?? undefined,
		dir: params.get('dir') ?? undefined,
		page: params.get('page') ?? undefined
	});
}

function escapeLike(s: string): string {
	return s.replace(/[\\%_]/g, (c) => `\\${c}`);
}

export async function listPeople(query: PeopleQuery) {
	const where: SQL | undefined = query.q
		? or(ilike(users.name, `%${escapeLike(query.q)}%`), ilike(users.email, `%${escapeLike(query.q)}%`))
		: undefined;
	const column = { name: users.name, email: users.email, created: users.createdAt }[query.sort];
	const order = query.dir === 'asc' ? asc(column) : desc(column);
	const [rows, [{ total }]] = await Promise.all([
		db
			.select({
				id: users.id,
				name: users.name,
				email: users.email,
				emailVerified: users.emailVerified,
				roles: users.roles,
				createdAt: users.createdAt
			})
			.from(users)
			.where(where)
			.orderBy(order, asc(users.id))
			.limit(pageSize)
			.offset((query.page - 1) * pageSize),
		db.select({ total: count() }).from(users).where(where)
	]);
	return { people: rows, total, pages: Math.max(1, Math.ceil(total / pageSize)) };
}

export const setRolesSchema = z.object({
	userId: z.string().min(1).max(64),
	roles: z
		.array(z.enum(roles, 'That is not a role Stopwise knows.'))
		.min(1, 'Pick at least one role.')
		.transform((list) => roles.filter((r) => list.includes(r)))
});

export type SetRolesResult =
	| { ok: true; changed: boolean; name: string; roles: Role[]; selfChanged: boolean }
	| { ok: false; message: string };

/**
 * Changes a person's roles, writes the audit entry and ends all of that person's sessions, in one
 * transaction: a role change never lands without its log line or leaves an old session holding old rights.
 */
export async function setRoles(actor: { id: string; email: string }, userId: string, next: Role[]): Promise<SetRolesResult> {
	if (actor.id === userId && !next.includes('admin')) {
		return { ok: false, message: 'You cannot take away your own admin role. Ask another admin.' };
	}
	return db.transaction(async (tx) => {
		// lock the row so two admins editing at once are applied one after the other, each logged against what it replaced
		const [target] = await tx
			.select({ id: users.id, email: users.email, name: users.name, roles: users.roles })
			.from(users)
			.where(eq(users.id, userId))
			.for('update');
		if (!target) return { ok: false, message: 'That person no longer exists.' } as const;
		const before = roles.filter((r) => target.roles.includes(r));
		if (before.join() === next.join()) {
			return { ok: true, changed: false, name: target.name, roles: before, selfChanged: false } as const;
		}
		await tx.update(users).set({ roles: next }).where(eq(users.id, userId));
		await tx.insert(roleAudit).values({
			targetUserId: target.id,
			targetEmail: target.email,
			actorUserId: actor.id,
			actorEmail: actor.email,
			rolesBefore: before,
			rolesAfter: next
		});
		const added = next.filter((r) => !before.includes(r)).map((r) => `+${r}`);
		const removed = before.filter((r) => !next.includes(r)).map((r) => `−${r}`);
		await recordAudit(tx, actor, { action: 'role.change', subject: target.email, detail: [...added, ...removed].join(' '), href: `/admin/people?q=${encodeURIComponent(target.email)}` });
		await endAllSessions(userId, tx);
		return { ok: true, changed: true, name: target.name, roles: next, selfChanged: actor.id === userId } as const;
	});
}

export async function listRoleAudit(page: number) {
	const target = sql<string | null>`(select name from users where users.id = ${roleAudit.targetUserId})`;
	const actor = sql<string | null>`(select name from users where users.id = ${roleAudit.actorUserId})`;
	const [rows, [{ total }]] = await Promise.all([
		db
			.select({
				id: roleAudit.id,
				targetName: target,
				targetEmail: roleAudit.targetEmail,
				actorName: actor,
				actorEmail: roleAudit.actorEmail,
				rolesBefore: roleAudit.rolesBefore,
				rolesAfter: roleAudit.rolesAfter,
				changedAt: roleAudit.changedAt
			})
			.from(roleAudit)
			.orderBy(desc(roleAudit.changedAt), desc(roleAudit.id))
			.limit(pageSize)
			.offset((page - 1) * pageSize),
		db.select({ total: count() }).from(roleAudit)
	]);
	return { entries: rows, total, pages: Math.max(1, Math.ceil(total / pageSize)) };
}
