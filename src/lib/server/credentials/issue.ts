// Issuing a course's certificate: once per learner and course, signed as a compact JWS (OB 3.0 VC-JWT), kept whole or not at all.
import { randomBytes, randomUUID } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import { SignJWT } from 'jose';
import { db } from '../db';
import { issuedCredentials, type IssuedCredential } from '../db/schema';
import { buildCredential } from './document';
import { courseStanding, type CourseStanding } from './eligibility';
import { SIGNING_ALG, signingKey } from './keys';

/** The address credentials name: `ORIGIN` when the app is served behind one, else the request's own. */
export function publicOrigin(requestOrigin: string): string {
	return (process.env.ORIGIN || requestOrigin).replace(/\/+$/, '');
}

export type ClaimResult =
	| { ok: true; credential: IssuedCredential; created: boolean }
	| { ok: false; reason: 'missing' | 'not-yet'; message: string; standing?: CourseStanding };

type Learner = { id: string; email: string; name: string };

export async function findCredential(userId: string, courseId: number): Promise<IssuedCredential | null> {
	const [row] = await db
		.select()
		.from(issuedCredentials)
		.where(and(eq(issuedCredentials.userId, userId), eq(issuedCredentials.courseId, courseId)))
		.limit(1);
	return row ?? null;
}

/** Signs the credential as OB 3.0 §8.2 describes: the credential is the JWT payload, with iss, jti and nbf beside it. */
async function sign(payload: ReturnType<typeof buildCredential>): Promise<{ jwt: string; kid: string }> {
	const { kid, key } = await signingKey();
	const jwt = await new SignJWT({ ...payload })
		.setProtectedHeader({ alg: SIGNING_ALG, typ: 'JWT', kid })
		.setIssuer(payload.issuer.id)
		.setJti(payload.id)
		.setNotBefore(Math.floor(Date.parse(payload.validFrom) / 1000))
		.sign(key);
	return { jwt, kid };
}

/**
 * The learner's certificate for a course: the one already issued, or a new one when they have earned it.
 * A double click or two tabs claiming at once find the same row (unique per learner and course).
 */
export async function claimCredential(learner: Learner, courseSlug: string, requestOrigin: string): Promise<ClaimResult> {
	const standing = await courseStanding(learner.id, courseSlug);
	if (!standing) return { ok: false, reason: 'missing', message: 'There is no such course.' };
	const existing = await findCredential(learner.id, standing.courseId);
	if (existing) return { ok: true, credential: existing, created: false };
	if (!standing.eligible) {
		return { ok: false, reason: 'not-yet', message: 'Not yet: finish every lesson and pass the Assignments the course counts, then claim it.', standing };
	}
	const id = randomUUID();
	const issuedAt = new Date(Math.floor(Date.now() / 1000) * 1000);
	const document = buildCredential({
		id,
		origin: publicOrigin(requestOrigin),
		issuedAt,
		learner: { name: learner.name, email: learner.email },
		course: { slug: standing.courseSlug, title: standing.courseTitle },
		passed: standing.counted.filter((a) => a.passed).map((a) => a.title),
		lessons: standing.lessons.total,
		salt: randomBytes(12).toString('base64url')
	});
	const { jwt, kid } = await sign(document);
	const [inserted] = await db
		.insert(issuedCredentials)
		.values({ id, userId: learner.id, courseId: standing.courseId, kid, jwt, issuedAt })
		.onConflictDoNothing({ target: [issuedCredentials.userId, issuedCredentials.courseId] })
		.returning();
	if (inserted) return { ok: true, credential: inserted, created: true };
	// another request issued it a moment ago: that one is the learner's certificate
	const winner = await findCredential(learner.id, standing.courseId);
	return { ok: true, credential: winner!, created: false };
}
