// Certificates of completion: who gets one (and only one), what it says, and that the public check tells valid, tampered and revoked apart.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { createLocalJWKSet, decodeProtectedHeader, exportJWK, generateKeyPair, jwtVerify, SignJWT, calculateJwkThumbprint } from 'jose';
import { PDFDocument } from 'pdf-lib';
import { db } from '$lib/server/db';
import { auditLog, courses, credentialRules, issuedCredentials } from '$lib/server/db/schema';
import { claimCredential } from '$lib/server/credentials/issue';
import { credentialJson, decodeStored, MAX_CREDENTIAL_CHARS, verifyById, verifyPasted } from '$lib/server/credentials/verify';
import { revokeCredential } from '$lib/server/credentials/register';
import { publicJwks } from '$lib/server/credentials/keys';
import { OB_CONTEXT, VC_CONTEXT, type OpenBadgeCredential } from '$lib/server/credentials/document';
import { certificatePdf } from '$lib/server/credentials/pdf';
import { courseStanding, requiredPasses } from '$lib/server/credentials/eligibility';
import { demoAccount, freshLearner, removeFreshPeople, userIdOf } from './support/people';
import { completeAllLessons, DEMO_COURSE, recordVerdicts } from './support/finish-course';

const origin = 'http://localhost:4173';
type Learner = { id: string; email: string; name: string };

async function finished(): Promise<Learner> {
	const l = await freshLearner();
	await completeAllLessons(l.id);
	await recordVerdicts(l.id, 'pass');
	return { id: l.id, email: l.email, name: 'Test Person' };
}

async function issued(): Promise<{ learner: Learner; id: string; jwt: string }> {
	const learner = await finished();
	const claim = await claimCredential(learner, DEMO_COURSE, origin);
	if (!claim.ok) throw new Error(claim.message);
	return { learner, id: claim.credential.id, jwt: claim.credential.jwt };
}

/** The same text with one character of the given part replaced by another valid base64url character. */
function flipOne(jwt: string, part: 0 | 1 | 2): string {
	const parts = jwt.split('.');
	const s = parts[part];
	const i = Math.floor(s.length / 2);
	parts[part] = s.slice(0, i) + (s[i] === 'A' ? 'B' : 'A') + s.slice(i + 1);
	return parts.join('.');
}

let courseId: number;
beforeAll(async () => {
	[{ id: courseId }] = await db.select({ id: courses.id }).from(courses).where(eq(courses.slug, DEMO_COURSE));
});
afterAll(async () => {
	await db.delete(credentialRules).where(eq(credentialRules.courseId, courseId));
	await removeFreshPeople();
});

describe('who earns a certificate', () => {
	test('a learner who has not finished gets none, and none is stored', async () => {
		const l = await freshLearner();
		const learner = { id: l.id, email: l.email, name: 'Test Person' };
		expect(await claimCredential(learner, DEMO_COURSE, origin)).toMatchObject({ ok: false, reason: 'not-yet' });
		// every lesson but one, every Assignment passed
		await completeAllLessons(l.id, DEMO_COURSE, 1);
		await recordVerdicts(l.id, 'pass');
		expect(await claimCredential(learner, DEMO_COURSE, origin)).toMatchObject({ ok: false, reason: 'not-yet' });
		const rows = await db.select().from(issuedCredentials).where(eq(issuedCredentials.userId, l.id));
		expect(rows).toEqual([]);
	});

	test('every lesson but a failed Assignment: none; the author’s lower minimum then lets it through', async () => {
		const l = await freshLearner();
		const learner = { id: l.id, email: l.email, name: 'Test Person' };
		await completeAllLessons(l.id);
		const total = (await courseStanding(l.id, DEMO_COURSE))!.counted.length;
		expect(total).toBeGreaterThan(1);
		await recordVerdicts(l.id, 'pass', DEMO_COURSE, total - 1);
		await recordVerdicts(l.id, 'fail');
		const standing = await courseStanding(l.id, DEMO_COURSE);
		expect(standing).toMatchObject({ lessons: { completed: standing!.lessons.total }, required: total, eligible: false });
		expect(await claimCredential(learner, DEMO_COURSE, origin)).toMatchObject({ ok: false, reason: 'not-yet' });

		await db.insert(credentialRules).values({ courseId, minimumPassed: total - 1 }).onConflictDoUpdate({ target: credentialRules.courseId, set: { minimumPassed: total - 1 } });
		try {
			expect(await claimCredential(learner, DEMO_COURSE, origin)).toMatchObject({ ok: true, created: true });
		} finally {
			await db.delete(credentialRules).where(eq(credentialRules.courseId, courseId));
		}
	});

	test('the minimum is kept within what counts (none set: all of them)', () => {
		expect(requiredPasses(null, 10)).toBe(10);
		expect(requiredPasses(4, 10)).toBe(4);
		expect(requiredPasses(12, 10)).toBe(10);
		expect(requiredPasses(-1, 10)).toBe(0);
	});

	test('a finished learner gets exactly one, however many claims arrive at once', async () => {
		const learner = await finished();
		const claims = await Promise.all(Array.from({ length: 6 }, () => claimCredential(learner, DEMO_COURSE, origin)));
		const ids = new Set(claims.map((c) => (c.ok ? c.credential.id : c.message)));
		expect(ids.size).toBe(1);
		expect(claims.filter((c) => c.ok && c.created)).toHaveLength(1);
		const rows = await db.select().from(issuedCredentials).where(and(eq(issuedCredentials.userId, learner.id), eq(issuedCredentials.courseId, courseId)));
		expect(rows).toHaveLength(1);
		// claiming later returns the same certificate
		expect(await claimCredential(learner, DEMO_COURSE, origin)).toMatchObject({ ok: true, created: false, credential: { id: rows[0].id } });
	});
});

describe('what the certificate says', () => {
	test('the JSON has the Open Badges 3.0 required fields (OB 3.0 §B.1 OpenBadgeCredential, Achievement, Profile)', async () => {
		const { jwt, id } = await issued();
		const c = credentialJson(decodeStored(jwt)) as unknown as OpenBadgeCredential;
		// VC Data Model 2.0 §4.3: the base context comes first; OB 3.0 adds its own context after it
		expect(c['@context']).toEqual([VC_CONTEXT, OB_CONTEXT]);
		expect(c.id).toBe(`urn:uuid:${id}`);
		expect(c.type).toEqual(expect.arrayContaining(['VerifiableCredential', 'OpenBadgeCredential']));
		expect(c.name).toMatch(/^Certificate of completion: Daylight Flash for Action$/);
		expect(c.issuer).toMatchObject({ id: `${origin}/credentials/issuer`, type: ['Profile'], name: 'Stopwise' });
		expect(c.validFrom).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}Z$/);
		expect(c.credentialSubject.type).toContain('AchievementSubject');
		expect(c.credentialSubject.identifier).toEqual(
			expect.arrayContaining([
				{ type: 'IdentityObject', identityType: 'name', hashed: false, identityHash: 'Test Person' },
				expect.objectContaining({ type: 'IdentityObject', identityType: 'emailAddress', hashed: true, identityHash: expect.stringMatching(/^sha256\$[0-9a-f]{64}$/) })
			])
		);
		const a = c.credentialSubject.achievement;
		expect(a.type).toContain('Achievement');
		for (const field of ['id', 'name', 'description'] as const) expect(a[field]).toEqual(expect.any(String));
		expect(a.criteria.narrative).toMatch(/ambient set under the metered exposure, subject relit by off-camera flash, verified from the frames/);
		expect(a.criteria.narrative).toMatch(/Assignments passed: /);
	});

	test('it is a compact JWS (EdDSA, RFC 8037) that an outside verifier checks with the published JWKS alone', async () => {
		const { jwt, id } = await issued();
		const header = decodeProtectedHeader(jwt);
		expect(header).toMatchObject({ alg: 'EdDSA', typ: 'JWT', kid: expect.any(String) });
		const jwks = await publicJwks();
		expect(jwks.keys.map((k) => k.kid)).toContain(header.kid);
		for (const key of jwks.keys) expect(key).not.toHaveProperty('d');
		const { payload } = await jwtVerify(jwt, createLocalJWKSet(jwks), { issuer: `${origin}/credentials/issuer` });
		expect(payload).toMatchObject({ jti: `urn:uuid:${id}`, iss: `${origin}/credentials/issuer`, nbf: expect.any(Number) });
	});

	test('the printable PDF is one page, names the learner and course, and carries the verification address', async () => {
		const { jwt, id } = await issued();
		const url = `${origin}/verify/credential/${id}`;
		const bytes = await certificatePdf(credentialJson(decodeStored(jwt)) as unknown as OpenBadgeCredential, url);
		expect(Buffer.from(bytes.slice(0, 5)).toString('latin1')).toBe('%PDF-');
		const doc = await PDFDocument.load(bytes);
		expect(doc.getPageCount()).toBe(1);
		expect(doc.getTitle()).toBe('Certificate of completion: Daylight Flash for Action');
		expect(doc.getSubject()).toBe(`Verify at ${url}`);
	});
});

describe('the public check', () => {
	test('an issued credential verifies, pasted or by its page', async () => {
		const { jwt, id } = await issued();
		const pasted = await verifyPasted(jwt);
		expect(pasted).toMatchObject({ status: 'valid', facts: { id, who: 'Test Person', what: 'Certificate of completion: Daylight Flash for Action', issuer: 'Stopwise' } });
		expect(await verifyById(id)).toMatchObject({ status: 'valid' });
		// line breaks from an e-mail or a PDF reader are ignored
		expect(await verifyPasted(`  ${jwt.slice(0, 40)}\n${jwt.slice(40)}\n`)).toMatchObject({ status: 'valid' });
	});

	test('one changed character anywhere fails it: tampered', async () => {
		const { jwt } = await issued();
		for (const part of [0, 1, 2] as const) {
			const result = await verifyPasted(flipOne(jwt, part));
			expect(result.status, `part ${part}`).not.toBe('valid');
		}
		expect((await verifyPasted(flipOne(jwt, 1))).status).toBe('tampered');
		expect((await verifyPasted(flipOne(jwt, 2))).status).toBe('tampered');
	});

	test('the JSON download verifies against the register; a changed field is tampering', async () => {
		const { jwt } = await issued();
		const json = credentialJson(decodeStored(jwt));
		expect(await verifyPasted(JSON.stringify(json, null, 2))).toMatchObject({ status: 'valid' });
		const forged = structuredClone(json) as unknown as OpenBadgeCredential;
		forged.credentialSubject.identifier[0].identityHash = 'Someone Else';
		expect(await verifyPasted(JSON.stringify(forged))).toMatchObject({ status: 'tampered' });
	});

	test('a revoked one says revoked, with an audit line; revoking twice is refused', async () => {
		const { jwt, id, learner } = await issued();
		const adminEmail = demoAccount('admin').email;
		const admin = { id: await userIdOf(adminEmail), email: adminEmail };
		expect(await revokeCredential(admin, id, 'issued by mistake')).toMatchObject({ ok: true });
		expect(await verifyPasted(jwt)).toMatchObject({ status: 'revoked', facts: { revokedReason: 'issued by mistake', revokedAt: expect.any(String) } });
		expect(await verifyById(id)).toMatchObject({ status: 'revoked' });
		const lines = await db.select().from(auditLog).where(and(eq(auditLog.action, 'credential.revoke'), eq(auditLog.detail, `certificate ${id}`)));
		expect(lines).toMatchObject([{ actorEmail: adminEmail, subject: `${learner.email} in Daylight Flash for Action`, reason: 'issued by mistake' }]);
		expect(await revokeCredential(admin, id, 'again')).toMatchObject({ ok: false, message: /already revoked/ });
		expect(await revokeCredential(admin, '00000000-0000-4000-8000-000000000000', '')).toMatchObject({ ok: false, message: /no such/ });
	});

	test('a credential signed by another key is not ours; garbage and huge pastes get a clear answer', async () => {
		const { privateKey, publicKey } = await generateKeyPair('EdDSA', { crv: 'Ed25519' });
		const kid = await calculateJwkThumbprint(await exportJWK(publicKey));
		const { jwt } = await issued();
		const forged = await new SignJWT(decodeStored(jwt)).setProtectedHeader({ alg: 'EdDSA', kid }).sign(privateKey);
		expect(await verifyPasted(forged)).toMatchObject({ status: 'unknown' });
		for (const bad of ['hello', 'a.b.c', '{not json', '[]', '{"id":"urn:uuid:00000000-0000-4000-8000-000000000000"}', 'x'.repeat(MAX_CREDENTIAL_CHARS + 1), '']) {
			const result = await verifyPasted(bad);
			expect(['unreadable', 'unknown'], bad.slice(0, 20)).toContain(result.status);
			expect(result.message.length).toBeGreaterThan(10);
		}
		expect(await verifyById('not-a-uuid')).toBeNull();
		expect(await verifyById('00000000-0000-4000-8000-000000000000')).toBeNull();
	});
});
