// The fake's state in memory (sessions, payment intents, charges, refunds, events), optionally mirrored to a JSON file.
import { existsSync, readFileSync, renameSync, writeFileSync } from 'node:fs';

const COLLECTIONS = /** @type {const} */ (['sessions', 'lineItems', 'intentData', 'paymentIntents', 'charges', 'refunds', 'events', 'idempotency']);

/**
 * @typedef {{ event: Record<string, any>, payload: string, deliveries: Array<Record<string, any>> }} EventEntry
 * @typedef {{
 *   sessions: Map<string, Record<string, any>>,
 *   lineItems: Map<string, Array<Record<string, any>>>,
 *   intentData: Map<string, { metadata: Record<string, string>, description: string | null }>,
 *   paymentIntents: Map<string, Record<string, any>>,
 *   charges: Map<string, Record<string, any>>,
 *   refunds: Map<string, Record<string, any>>,
 *   events: Map<string, EventEntry>,
 *   idempotency: Map<string, { fingerprint: string, status: number, body: string }>,
 *   save: () => void
 * }} Store
 */

/**
 * Reads the file when there is one; a file that cannot be read stops the start rather than being overwritten.
 * @param {string | undefined} file
 * @returns {Store}
 */
export function openStore(file) {
	/** @type {Record<string, Map<string, any>>} */
	const maps = Object.fromEntries(COLLECTIONS.map((name) => [name, new Map()]));
	if (file && existsSync(file)) {
		let saved;
		try {
			saved = JSON.parse(readFileSync(file, 'utf8'));
		} catch (e) {
			throw new Error(`cannot read the state file ${file} (${e instanceof Error ? e.message : e}); move it away or fix it`);
		}
		for (const name of COLLECTIONS) {
			if (saved[name] !== undefined && !Array.isArray(saved[name])) throw new Error(`state file ${file}: "${name}" is not a list`);
			for (const [key, value] of saved[name] ?? []) maps[name].set(key, value);
		}
	}
	const save = () => {
		if (!file) return;
		const data = Object.fromEntries(COLLECTIONS.map((name) => [name, [...maps[name]]]));
		// write then rename, so a crash mid-write never leaves half a file behind
		const temp = `${file}.${process.pid}.tmp`;
		writeFileSync(temp, JSON.stringify(data));
		renameSync(temp, file);
	};
	return /** @type {Store} */ ({ ...maps, save });
}
