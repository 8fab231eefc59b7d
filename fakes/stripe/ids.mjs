// Makes ids in the API's style: a type prefix, an underscore and random base-62 characters.
import { randomBytes } from 'node:crypto';

const ALPHABET = '0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz';

/**
 * @param {string} prefix e.g. 'pi', 'cs_test'
 * @param {number} [length]
 */
export function createId(prefix, length = 24) {
	let out = '';
	// 248 is the largest multiple of 62 below 256: rejecting the rest keeps every character equally likely
	while (out.length < length) {
		for (const byte of randomBytes(length * 2)) {
			if (byte < 248 && out.length < length) out += ALPHABET[byte % 62];
		}
	}
	return `${prefix}_${out}`;
}

export function nowSeconds() {
	return Math.floor(Date.now() / 1000);
}
