// The school's Ed25519 signing key: made once (race-safe), kept in the database as JWKs, published as a JWKS.
import { eq } from 'drizzle-orm';
import { calculateJwkThumbprint, exportJWK, generateKeyPair, importJWK, type CryptoKey, type JWK } from 'jose';
import { db, type Db } from '../db';
import { issuerKeys, type IssuerKey } from '../db/schema';

type Runner = Db | Parameters<Parameters<Db['transaction']>[0]>[0];

/** JWS algorithm of every credential: EdDSA over Ed25519 (RFC 8037). */
export const SIGNING_ALG = 'EdDSA';

/**
 * The active key, made when there is none. Two first starts at once both generate a pair; the unique index on the
 * active key keeps the first one stored, and both read that one back.
 */
export async function ensureIssuerKey(runner: Runner = db): Promise<IssuerKey> {
	const [existing] = await runner.select().from(issuerKeys).where(eq(issuerKeys.active, true)).limit(1);
	if (existing) return existing;
	const { privateKey, publicKey } = await generateKeyPair(SIGNING_ALG, { crv: 'Ed25519', extractable: true });
	const publicJwk = await exportJWK(publicKey);
	const privateJwk = await exportJWK(privateKey);
	const kid = await calculateJwkThumbprint(publicJwk);
	await runner
		.insert(issuerKeys)
		.values({ kid, publicJwk: { ...(publicJwk as Record<string, string>), kid, alg: SIGNING_ALG, use: 'sig' }, privateJwk: privateJwk as Record<string, string> })
		.onConflictDoNothing();
	const [stored] = await runner.select().from(issuerKeys).where(eq(issuerKeys.active, true)).limit(1);
	return stored;
}

export async function signingKey(): Promise<{ kid: string; key: CryptoKey }> {
	const row = await ensureIssuerKey();
	return { kid: row.kid, key: (await importJWK(row.privateJwk as JWK, SIGNING_ALG)) as CryptoKey };
}

/** A key by its id, active or retired (credentials signed before a change of key still verify); null when unknown. */
export async function publicKeyById(kid: string): Promise<CryptoKey | null> {
	const [row] = await db.select({ publicJwk: issuerKeys.publicJwk }).from(issuerKeys).where(eq(issuerKeys.kid, kid)).limit(1);
	return row ? ((await importJWK(row.publicJwk as JWK, SIGNING_ALG)) as CryptoKey) : null;
}

/** Every public key, as the JSON Web Key Set (RFC 7517 §5) served at /.well-known/jwks.json. */
export async function publicJwks(): Promise<{ keys: JWK[] }> {
	await ensureIssuerKey();
	const rows = await db.select({ publicJwk: issuerKeys.publicJwk }).from(issuerKeys).orderBy(issuerKeys.createdAt);
	return { keys: rows.map((r) => r.publicJwk as JWK) };
}
