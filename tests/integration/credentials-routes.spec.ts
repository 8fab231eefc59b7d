// Certificates through their pages and routes: claiming (a double click issues one), downloads for the holder only,
// the public pages, an admin's revocation and an author's rules, as the forms send them.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { PDFDocument } from 'pdf-lib';
import { db } from '$lib/server/db';
import { assignments, courses, credentialRules, issuedCredentials } from '$lib/server/db/schema';
import * as progressPage from '../../src/routes/(learn)/progress/+page.server';
import * as verifyPage from '../../src/routes/(public)/verify/credential/+page.server';
import * as verifyIdPage from '../../src/routes/(public)/verify/credential/[id]/+page.server';
import * as adminPage from '../../src/routes/(admin)/admin/credentials/+page.server';
import * as rulesPage from '../../src/routes/(author)/author/certificates/+page.server';
import * as download from '../../src/routes/api/v1/credentials/[id]/+server';
import * as jwksRoute from '../../src/routes/.well-known/jwks.json/+server';
import { failureOf, makeEvent, throughHooks, valueOf } from './support/request-event';
import { demoAccount, freshLearner, removeFreshPeople, signedInCookies } from './support/people';
import { completeAllLessons, DEMO_COURSE, recordVerdicts } from './support/finish-course';

type Cookies = Awaited<ReturnType<typeof signedInCookies>>;

async function claim(cookies: Cookies, course = DEMO_COURSE) {
	const event = makeEvent({ path: '/progress?/claim', form: { course }, cookies, routeId: '/(learn)/progress' });
	return throughHooks(event, (e) => progressPage.actions.claim(e as never));
}

async function get(cookies: Cookies | undefined, id: string, format: string) {
	const event = makeEvent({ method: 'GET', path: `/api/v1/credentials/${id}?format=${format}`, params: { id }, cookies, routeId: '/api/v1/credentials/[id]' });
	return valueOf<Response>(await throughHooks(event, (e) => download.GET(e as never)));
}

let learner: { id: string; email: string };
let learnerCookies: Cookies;
let credentialId: string;
let courseId: number;

beforeAll(async () => {
	[{ id: courseId }] = await db.select({ id: courses.id }).from(courses).where(eq(courses.slug, DEMO_COURSE));
	learner = await freshLearner();
	learnerCookies = await signedInCookies(learner.email);
});
afterAll(async () => {
	await db.update(assignments).set({ countsForCredential: true });
	await db.delete(credentialRules).where(eq(credentialRules.courseId, courseId));
	await removeFreshPeople();
});

describe('the learner’s side', () => {
	test('before finishing, the claim is refused with a message and nothing is issued', async () => {
		const outcome = await claim(learnerCookies);
		expect(failureOf(valueOf(outcome))?.status).toBe(400);
		expect(await db.select().from(issuedCredentials).where(eq(issuedCredentials.userId, learner.id))).toEqual([]);
	});

	test('after finishing, a double-clicked claim issues exactly one certificate, shown on the progress page', async () => {
		await completeAllLessons(learner.id);
		await recordVerdicts(learner.id, 'pass');
		const [a, b] = await Promise.all([claim(learnerCookies), claim(learnerCookies)]);
		expect(a.kind).toBe('value');
		expect(b.kind).toBe('value');
		const rows = await db.select().from(issuedCredentials).where(eq(issuedCredentials.userId, learner.id));
		expect(rows).toHaveLength(1);
		credentialId = rows[0].id;
		const page = valueOf<{ certificates: { issued: { id: string } | null }[] }>(
			await throughHooks(makeEvent({ path: '/progress', cookies: learnerCookies }), (e) => progressPage.load(e as never))
		);
		expect(page.certificates).toMatchObject([{ issued: { id: credentialId } }]);
	});

	test('the holder downloads the PDF, the .jwt and the JSON; another learner gets 404, a bad format 400', async () => {
		const pdf = await get(learnerCookies, credentialId, 'pdf');
		expect(pdf.status).toBe(200);
		expect(pdf.headers.get('content-type')).toBe('application/pdf');
		expect((await PDFDocument.load(new Uint8Array(await pdf.arrayBuffer()))).getPageCount()).toBe(1);
		const jwt = await get(learnerCookies, credentialId, 'jwt');
		expect(jwt.headers.get('content-disposition')).toMatch(/attachment; filename="stopwise-certificate-daylight-flash-for-action\.jwt"/);
		expect((await jwt.text()).split('.')).toHaveLength(3);
		const json = await (await get(learnerCookies, credentialId, 'json')).json();
		expect(json).toMatchObject({ type: ['VerifiableCredential', 'OpenBadgeCredential'], id: `urn:uuid:${credentialId}` });
		const other = await freshLearner();
		expect((await get(await signedInCookies(other.email), credentialId, 'pdf')).status).toBe(404);
		expect((await get(learnerCookies, credentialId, 'exe')).status).toBe(400);
		expect((await get(undefined, credentialId, 'pdf')).status).toBe(401);
	});
});

describe('the public side', () => {
	test('the JWKS lists the signing key, without its private part', async () => {
		const res = await jwksRoute.GET(makeEvent({ method: 'GET', path: '/.well-known/jwks.json' }) as never);
		const body = (await res.json()) as { keys: Record<string, string>[] };
		expect(body.keys[0]).toMatchObject({ kty: 'OKP', crv: 'Ed25519', alg: 'EdDSA', use: 'sig', kid: expect.any(String), x: expect.any(String) });
		expect(body.keys.some((k) => 'd' in k)).toBe(false);
	});

	test('the certificate’s page and a pasted .jwt say valid; garbage and a huge paste get a clear message, no 500', async () => {
		const page = valueOf<{ result: { status: string } }>(await throughHooks(makeEvent({ path: `/verify/credential/${credentialId}`, params: { id: credentialId } }), (e) => verifyIdPage.load(e as never)));
		expect(page.result.status).toBe('valid');
		const missing = await throughHooks(makeEvent({ path: '/verify/credential/nope', params: { id: 'nope' } }), (e) => verifyIdPage.load(e as never));
		expect(missing).toMatchObject({ kind: 'error', status: 404 });

		const [row] = await db.select({ jwt: issuedCredentials.jwt }).from(issuedCredentials).where(eq(issuedCredentials.id, credentialId));
		const paste = (text: string) => throughHooks(makeEvent({ path: '/verify/credential', form: { credential: text } }), (e) => verifyPage.actions.default(e as never));
		expect(valueOf(await paste(row.jwt))).toMatchObject({ result: { status: 'valid', facts: { who: 'Test Person' } } });
		expect(valueOf(await paste('not a credential at all'))).toMatchObject({ result: { status: 'unreadable' } });
		const huge = failureOf(valueOf(await paste('x'.repeat(100_000))));
		expect(huge?.status).toBe(400);
		expect(JSON.stringify(huge?.data)).toMatch(/far longer than any certificate/);
	});

	test('an admin revokes it with a reason; the public page then says revoked; a learner cannot revoke', async () => {
		const revoke = (cookies: Cookies, reason: string) =>
			throughHooks(makeEvent({ path: '/admin/credentials?/revoke', form: { credentialId, reason }, cookies, routeId: '/(admin)/admin/credentials' }), (e) =>
				adminPage.actions.revoke(e as never)
			);
		expect(await revoke(learnerCookies, 'mine')).toMatchObject({ kind: 'error', status: 403 });
		const admin = await signedInCookies(demoAccount('admin').email);
		expect(failureOf(valueOf(await revoke(admin, '')))?.status).toBe(400);
		expect(failureOf(valueOf(await revoke(admin, 'shown to be copied work')))).toBeNull();
		const page = valueOf<{ result: { status: string; facts: { revokedReason: string } } }>(
			await throughHooks(makeEvent({ path: `/verify/credential/${credentialId}`, params: { id: credentialId } }), (e) => verifyIdPage.load(e as never))
		);
		expect(page.result).toMatchObject({ status: 'revoked', facts: { revokedReason: 'shown to be copied work' } });
		const list = valueOf<{ issued: { id: string; revokedAt: Date | null }[] }>(await throughHooks(makeEvent({ path: '/admin/credentials', cookies: admin }), (e) => adminPage.load(e as never)));
		expect(list.issued.find((c) => c.id === credentialId)?.revokedAt).toBeInstanceOf(Date);
	});
});

describe('the author’s rules', () => {
	test('ticking fewer Assignments and a minimum is stored; a minimum above what counts is refused', async () => {
		const author = await signedInCookies(demoAccount('author').email);
		const page = valueOf<{ courses: { slug: string; assignments: { id: number }[] }[] }>(await throughHooks(makeEvent({ path: '/author/certificates', cookies: author }), (e) => rulesPage.load(e as never)));
		const ids = page.courses.find((c) => c.slug === DEMO_COURSE)!.assignments.map((a) => a.id);
		const save = (form: Record<string, string | string[]>) =>
			throughHooks(makeEvent({ path: '/author/certificates', form: { course: DEMO_COURSE, ...form }, cookies: author, routeId: '/(author)/author/certificates' }), (e) => rulesPage.actions.default(e as never));
		const tooMany = failureOf(valueOf(await save({ counted: ids.slice(0, 2).map(String), minimum: '3' })));
		expect(tooMany?.status).toBe(400);
		expect(failureOf(valueOf(await save({ counted: ids.slice(0, 3).map(String), minimum: '2' })))).toBeNull();
		const counted = await db.select({ id: assignments.id }).from(assignments).where(eq(assignments.countsForCredential, true));
		expect(counted.map((a) => a.id).filter((id) => ids.includes(id)).sort()).toEqual(ids.slice(0, 3).sort());
		expect(await db.select({ minimum: credentialRules.minimumPassed }).from(credentialRules).where(eq(credentialRules.courseId, courseId))).toEqual([{ minimum: 2 }]);
		const learnerTry = await throughHooks(makeEvent({ path: '/author/certificates', form: { course: DEMO_COURSE }, cookies: learnerCookies }), (e) => rulesPage.actions.default(e as never));
		expect(learnerTry).toMatchObject({ kind: 'error', status: 403 });
	});
});
