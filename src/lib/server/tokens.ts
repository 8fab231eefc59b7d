// One-time links (verify e-mail, reset password, change e-mail): random tokens, stored only as SHA-256, used once.
import { createHash, randomBytes } from 'node:crypto';
import { and, eq, gt, isNull, sql } from 'drizzle-orm';
import { db, type Db } from './db';
import { authTokens, type AuthToken, type TokenPurpose } from './db/schema';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/** How long each kind of link works. */
export const tokenLifetimeMinutes: Record<TokenPurpose, number> = {
	verify_email: 48 * 60,
	reset_password: 60,
	change_email: 24 * 60
};

function hashToken(token: string): string {
	return createHash('sha256').update(token).digest('hex');
}

/** Issues a new link token; earlier unused tokens of the same purpose for this person stop working. */
export async function issueToken(userId: string, purpose: TokenPurpose, email: string): Promise<string> {
	const token = randomBytes(32).toString('base64url');
	const minutes = tokenLifetimeMinutes[purpose];
	await db.transaction(async (tx) => {
		await tx
			.update(authTokens)
			.set({ usedAt: sql`now()` })
			.where(and(eq(authTokens.userId, userId), eq(authTokens.purpose, purpose), isNull(authTokens.usedAt)));
		await tx.insert(authTokens).values({
			tokenHash: hashToken(token),
			userId,
			purpose,
			email,
			expiresAt: sql`now() + make_interval(mins => ${minutes})`
		});
	});
	return token;
}

/** A token that is still usable (unused, unexpired), without using it up: for showing the confirm form. */
export async function peekToken(token: string, purpose: TokenPurpose): Promise<AuthToken | null> {
	if (!token) return null;
	const row = await db.query.authTokens.findFirst({
		where: and(
			eq(authTokens.tokenHash, hashToken(token)),
			eq(authTokens.purpose, purpose),
			isNull(authTokens.usedAt),
			gt(authTokens.expiresAt, sql`now()`)
		)
	});
	return row ?? null;
}

/**
 * Uses a token up inside the caller's transaction: one UPDATE that only matches an unused,
 * unexpired token, so two requests racing with the same link cannot both succeed.
 */
export async function consumeToken(tx: Tx, token: string, purpose: TokenPurpose): Promise<AuthToken | null> {
	if (!token) return null;
	const [row] = await tx
		.update(authTokens)
		.set({ usedAt: sql`now()` })
		.where(
			and(
				eq(authTokens.tokenHash, hashToken(token)),
				eq(authTokens.purpose, purpose),
				isNull(authTokens.usedAt),
				gt(authTokens.expiresAt, sql`now()`)
			)
		)
		.returning();
	return row ?? null;
}

/** When the newest token of this purpose for the person was issued (to space out repeated mails). */
export async function lastIssuedAt(userId: string, purpose: TokenPurpose): Promise<Date | null> {
	const [row] = await db
		.select({ at: sql<Date>`max(${authTokens.createdAt})` })
		.from(authTokens)
		.where(and(eq(authTokens.userId, userId), eq(authTokens.purpose, purpose)));
	return row?.at ? new Date(row.at) : null;
}
