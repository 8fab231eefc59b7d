// Statement ids: a name-based UUID (version 5, RFC 4122 §4.3) for events that could be recorded twice, so they are not.
import { createHash } from 'node:crypto';

/** Our own namespace for statement ids (a random UUID chosen once; never change it, or ids change). */
export const STATEMENT_NAMESPACE = '4f2b7d0e-9c31-4a57-8e6b-2d1c5a9f3e70';

/** The version-5 UUID of a name in a namespace: SHA-1 of the namespace's bytes then the name's UTF-8, version and variant set. */
export function uuidV5(name: string, namespace = STATEMENT_NAMESPACE): string {
	const hash = createHash('sha1').update(Buffer.from(namespace.replace(/-/g, ''), 'hex')).update(name, 'utf8').digest();
	const bytes = hash.subarray(0, 16);
	bytes[6] = (bytes[6] & 0x0f) | 0x50;
	bytes[8] = (bytes[8] & 0x3f) | 0x80;
	const hex = bytes.toString('hex');
	return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
}

/** The statement id of an event that has one natural key (the first completion of a lesson, an attempt's verdict…). */
export const statementIdFor = (...parts: (string | number)[]) => uuidV5(parts.join('/'));
