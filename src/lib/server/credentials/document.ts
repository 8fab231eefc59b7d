// The Open Badges 3.0 credential (a W3C Verifiable Credential, Data Model 2.0) for one finished course, as plain JSON.
import { createHash } from 'node:crypto';

/** VC Data Model 2.0 base context, then the Open Badges 3.0 context (1EdTech, context-3.0.3). */
export const VC_CONTEXT = 'https://www.w3.org/ns/credentials/v2';
export const OB_CONTEXT = 'https://purl.imsglobal.org/spec/ob/v3p0/context-3.0.3.json';
/** The JSON Schema 1EdTech publishes for achievement credentials (named so validators can fetch it). */
export const OB_SCHEMA = 'https://purl.imsglobal.org/spec/ob/v3p0/schema/json/ob_v3p0_achievementcredential_schema.json';

export const SCHOOL_NAME = 'Stopwise';

export interface IdentityObject {
	type: 'IdentityObject';
	identityType: 'name' | 'emailAddress';
	hashed: boolean;
	identityHash: string;
	salt?: string;
}

export interface OpenBadgeCredential {
	'@context': string[];
	id: string;
	type: string[];
	name: string;
	description: string;
	issuer: { id: string; type: string[]; name: string; url: string };
	validFrom: string;
	credentialSubject: {
		type: string[];
		identifier: IdentityObject[];
		achievement: {
			id: string;
			type: string[];
			achievementType: string;
			name: string;
			description: string;
			criteria: { narrative: string };
		};
	};
	credentialSchema: { id: string; type: string }[];
}

export interface CredentialFacts {
	id: string;
	origin: string;
	issuedAt: Date;
	learner: { name: string; email: string };
	course: { slug: string; title: string };
	/** the Assignments whose pass counted, by title */
	passed: string[];
	lessons: number;
	/** random, per credential: the salt of the e-mail's hash */
	salt: string;
}

export const issuerId = (origin: string) => `${origin}/credentials/issuer`;

/** The issuer as the issuer URL serves it: the credential's `issuer`, plus where the keys are. */
export function issuerProfile(origin: string) {
	return {
		'@context': [VC_CONTEXT, OB_CONTEXT],
		id: issuerId(origin),
		type: ['Profile'],
		name: SCHOOL_NAME,
		url: origin,
		description: 'An online school for lighting moving people with flash in daylight. Certificates are signed with EdDSA (Ed25519); the keys are at /.well-known/jwks.json.'
	};
}

/**
 * What the certificate stands for, in our own words: what was measured from the learner's files, not that pages were
 * read. Named Assignments are those that counted.
 */
export function criteriaNarrative(facts: Pick<CredentialFacts, 'course' | 'passed' | 'lessons'>): string {
	const head =
		`Completed all ${facts.lessons} lessons of “${facts.course.title}” on Stopwise and shot the course’s Assignments in daylight: ` +
		'ambient set under the metered exposure, subject relit by off-camera flash, verified from the frames themselves ' +
		'(Exif settings and the measured levels of subject and background), with a mentor deciding where the files could not tell.';
	if (facts.passed.length === 0) return head;
	return `${head} Assignments passed: ${facts.passed.join('; ')}.`;
}

/** The e-mail as Open Badges hashes it: `sha256$` and the hex SHA-256 of address and salt. */
export function hashedEmail(email: string, salt: string): string {
	return `sha256$${createHash('sha256').update(email.toLowerCase() + salt).digest('hex')}`;
}

export function buildCredential(facts: CredentialFacts): OpenBadgeCredential {
	const { origin, course } = facts;
	return {
		'@context': [VC_CONTEXT, OB_CONTEXT],
		id: `urn:uuid:${facts.id}`,
		type: ['VerifiableCredential', 'OpenBadgeCredential'],
		name: `Certificate of completion: ${course.title}`,
		description: `${facts.learner.name} completed “${course.title}”, a Stopwise course in lighting moving people with flash in daylight.`,
		issuer: { id: issuerId(origin), type: ['Profile'], name: SCHOOL_NAME, url: origin },
		// whole seconds: the JWT's nbf carries the same moment
		validFrom: new Date(Math.floor(facts.issuedAt.getTime() / 1000) * 1000).toISOString().replace('.000Z', 'Z'),
		credentialSubject: {
			type: ['AchievementSubject'],
			identifier: [
				{ type: 'IdentityObject', identityType: 'name', hashed: false, identityHash: facts.learner.name },
				{ type: 'IdentityObject', identityType: 'emailAddress', hashed: true, identityHash: hashedEmail(facts.learner.email, facts.salt), salt: facts.salt }
			],
			achievement: {
				id: `${origin}/courses/${course.slug}#certificate`,
				type: ['Achievement'],
				achievementType: 'Certificate',
				name: `Certificate of completion: ${course.title}`,
				description: `Awarded by Stopwise to a learner who finished “${course.title}”: every lesson, and the Assignments the course counts, passed from their own frames.`,
				criteria: { narrative: criteriaNarrative(facts) }
			}
		},
		credentialSchema: [{ id: OB_SCHEMA, type: '1EdTechJsonSchemaValidator2019' }]
	};
}

/** The learner's name as the credential states it (the unhashed `name` identifier). */
export function subjectName(credential: Pick<OpenBadgeCredential, 'credentialSubject'>): string {
	return credential.credentialSubject.identifier.find((i) => i.identityType === 'name' && !i.hashed)?.identityHash ?? '';
}
