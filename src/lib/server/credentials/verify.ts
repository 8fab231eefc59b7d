// Checking a credential: the signature against the school's published key, then the register for a revocation.
import { eq } from 'drizzle-orm';
import { decodeJwt, decodeProtectedHeader, errors, jwtVerify } from 'jose';
import { db } from '../db';
import { courses, issuedCredentials } from '../db/schema';
import { subjectName, type OpenBadgeCredential } from './document';
import { SIGNING_ALG, publicKeyById } from './keys';

/** Longer than any credential we issue (about 3 KB) by far; a longer paste is refused before any parsing. */
export const MAX_CREDENTIAL_CHARS = 16_384;

export type VerifyStatus = 'valid' | 'revoked' | 'tampered' | 'unknown' | 'unreadable';

export interface VerifiedFacts {
	id: string;
	who: string;
	what: string;
	course: string;
	when: string;
	issuer: string;
	issuerUrl: string;
	criteria: string;
	revokedAt: string | null;
	revokedReason: string;
}

export interface VerifyResult {
	status: VerifyStatus;
	/** one sentence for the page */
	message: string;
	facts?: VerifiedFacts;
}

const compactJws = /^[A-Za-z0-9_-]+\.[A-Za-z0-9_-]+\.[A-Za-z0-9_-]+$/;
const uuidUrn = /^urn:uuid:([0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12})$/;
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

const unreadable = (message: string): VerifyResult => ({ status: 'unreadable', message });
const tampered: VerifyResult = { status: 'tampered', message: 'Tampered: the signature does not match this content. Do not trust it.' };

/** The registered claims the JWT adds beside the credential (OB 3.0 §8.2): left out when comparing with a JSON copy. */
const JWT_CLAIMS = new Set(['iss', 'jti', 'nbf', 'sub', 'iat', 'exp', 'aud']);

function isCredentialShape(p: Record<string, unknown>): p is Record<string, unknown> & OpenBadgeCredential {
	const types = p.type;
	const subject = p.credentialSubject as Record<string, unknown> | undefined;
	return (
		Array.isArray(types) &&
		types.includes('OpenBadgeCredential') &&
		typeof p.id === 'string' &&
		typeof p.validFrom === 'string' &&
		typeof (p.issuer as { id?: unknown } | undefined)?.id === 'string' &&
		!!subject &&
		Array.isArray(subject.identifier) &&
		typeof (subject.achievement as { name?: unknown } | undefined)?.name === 'string'
	);
}

/** Verifies a compact JWS: the payload it carries when the signature and shape hold, or why not. */
async function checkSignature(token: string): Promise<{ ok: true; payload: Record<string, unknown> & OpenBadgeCredential } | { ok: false; result: VerifyResult }> {
	if (!compactJws.test(token)) return { ok: false, result: unreadable('That is not a credential: paste the whole .jwt text (three parts joined by dots) or the .json file.') };
	let kid: string | undefined;
	try {
		const header = decodeProtectedHeader(token);
		if (header.alg !== SIGNING_ALG || typeof header.kid !== 'string') return { ok: false, result: { status: 'unknown', message: 'Not signed the way Stopwise signs certificates: this school did not issue it.' } };
		kid = header.kid;
	} catch {
		return { ok: false, result: unreadable('That text cannot be read as a signed credential: part of it is missing or damaged.') };
	}
	const key = kid.length <= 200 ? await publicKeyById(kid) : null;
	if (!key) return { ok: false, result: { status: 'unknown', message: 'Not signed by any key this school has published: Stopwise did not issue it.' } };
	try {
		const { payload } = await jwtVerify(token, key, { algorithms: [SIGNING_ALG] });
		const p = payload as Record<string, unknown>;
		if (!isCredentialShape(p) || p.jti !== p.id || p.iss !== p.issuer.id) return { ok: false, result: tampered };
		return { ok: true, payload: p };
	} catch (e) {
		if (e instanceof errors.JWSSignatureVerificationFailed) return { ok: false, result: tampered };
		if (e instanceof errors.JWTClaimValidationFailed) return { ok: false, result: { status: 'tampered', message: 'Not valid yet or no longer valid: its dates do not hold.' } };
		// any other failure to read it (broken JSON inside, bad encoding) is damage too
		if (e instanceof errors.JOSEError) return { ok: false, result: tampered };
		throw e;
	}
}

async function registerEntry(id: string) {
	const [row] = await db
		.select({ jwt: issuedCredentials.jwt, revokedAt: issuedCredentials.revokedAt, revokedReason: issuedCredentials.revokedReason, courseSlug: courses.slug })
		.from(issuedCredentials)
		.innerJoin(courses, eq(issuedCredentials.courseId, courses.id))
		.where(eq(issuedCredentials.id, id))
		.limit(1);
	return row ?? null;
}

function factsOf(p: OpenBadgeCredential, entry: Awaited<ReturnType<typeof registerEntry>> | null): VerifiedFacts {
	return {
		id: p.id.replace(/^urn:uuid:/, ''),
		who: subjectName(p),
		what: p.credentialSubject.achievement.name,
		course: entry?.courseSlug ?? '',
		when: p.validFrom,
		issuer: p.issuer.name,
		issuerUrl: p.issuer.url,
		criteria: p.credentialSubject.achievement.criteria?.narrative ?? '',
		revokedAt: entry?.revokedAt?.toISOString() ?? null,
		revokedReason: entry?.revokedReason ?? ''
	};
}

async function answerFor(payload: Record<string, unknown> & OpenBadgeCredential): Promise<VerifyResult> {
	const id = uuidUrn.exec(payload.id)?.[1];
	const entry = id ? await registerEntry(id) : null;
	const facts = factsOf(payload, entry);
	if (entry?.revokedAt) return { status: 'revoked', message: 'Revoked: the signature is genuine, but the school has withdrawn this certificate.', facts };
	if (!entry) return { status: 'valid', message: 'Genuine: signed by Stopwise’s key and unchanged (it is not in this school’s register, so it cannot say whether it was withdrawn).', facts };
	return { status: 'valid', message: 'Valid: signed by Stopwise, unchanged since it was issued, and not revoked.', facts };
}

/** A stable text of a JSON value (keys sorted), to compare a pasted copy with the signed one. */
function canonical(value: unknown): string {
	if (Array.isArray(value)) return `[${value.map(canonical).join(',')}]`;
	if (value && typeof value === 'object') {
		return `{${Object.keys(value)
			.sort()
			.map((k) => `${JSON.stringify(k)}:${canonical((value as Record<string, unknown>)[k])}`)
			.join(',')}}`;
	}
	return JSON.stringify(value);
}

/** The credential's JSON without the JWT's own claims: what the learner's .json download holds. */
export function credentialJson(payload: Record<string, unknown>): Record<string, unknown> {
	return Object.fromEntries(Object.entries(payload).filter(([k]) => !JWT_CLAIMS.has(k)));
}

/** A JSON copy is checked against the signed original in the register: any change in it is tampering. */
async function verifyJsonCopy(text: string): Promise<VerifyResult> {
	let parsed: unknown;
	try {
		parsed = JSON.parse(text);
	} catch {
		return unreadable('That looks like JSON but cannot be read: part of it is missing or damaged.');
	}
	if (!parsed || typeof parsed !== 'object' || Array.isArray(parsed)) return unreadable('That JSON is not a credential.');
	const p = parsed as Record<string, unknown>;
	const id = typeof p.id === 'string' ? uuidUrn.exec(p.id)?.[1] : undefined;
	if (!id) return { status: 'unknown', message: 'That JSON does not name a certificate this school issued.' };
	const entry = await registerEntry(id);
	if (!entry) return { status: 'unknown', message: 'No certificate with that id was issued by this school.' };
	const signed = await checkSignature(entry.jwt);
	if (!signed.ok) return signed.result;
	if (canonical(credentialJson(signed.payload)) !== canonical(credentialJson(p))) return tampered;
	return answerFor(signed.payload);
}

/** What the paste form checks: a compact JWS or the JSON download; never throws for bad input. */
export async function verifyPasted(input: string): Promise<VerifyResult> {
	if (input.length > MAX_CREDENTIAL_CHARS) return unreadable(`That is far longer than any certificate (${MAX_CREDENTIAL_CHARS.toLocaleString('en')} characters at most): paste only the credential.`);
	const text = input.trim();
	if (!text) return unreadable('Paste a credential first.');
	if (text.startsWith('{')) return verifyJsonCopy(text);
	const signed = await checkSignature(text.replace(/\s+/g, ''));
	return signed.ok ? answerFor(signed.payload) : signed.result;
}

/** The public page of one issued credential, by its id. Null when there is none. */
export async function verifyById(id: string): Promise<VerifyResult | null> {
	if (!UUID.test(id)) return null;
	const entry = await registerEntry(id);
	if (!entry) return null;
	const signed = await checkSignature(entry.jwt);
	return signed.ok ? answerFor(signed.payload) : signed.result;
}

/** The signed payload of a stored credential, decoded (no check: for downloads of our own register). */
export function decodeStored(jwt: string): Record<string, unknown> {
	return decodeJwt(jwt) as Record<string, unknown>;
}
