// Benchmark: a failed sign-in for an unknown address costs the same password hashing as for a known one, so the
// answer's timing does not tell which addresses have accounts (moved here from the test suite: timings are figures).
import { randomBytes } from 'node:crypto';
import { sql } from 'drizzle-orm';
import { db } from '../../src/lib/server/db/index';
import { signInWithPassword, signUp } from '../../src/lib/server/accounts';
import { median, ms, type Bench } from './timing';

const ROUNDS = 7;
/** Without the dummy hash an unknown address answers in about a millisecond, a known one after a full argon2id check. */
const MIN_RATIO = 0.5;

const address = () => `2001:db8::${randomBytes(2).toString('hex')}:${randomBytes(2).toString('hex')}`;

export const signInTimingBench: Bench = {
	name: 'failed sign-in: unknown address against known address',
	async run() {
		const email = `bench-signin-${randomBytes(4).toString('hex')}@bench.example`;
		const made = await signUp({ name: 'Bench person (invented)', email, password: 'a long bench passphrase' });
		if (!made.ok) throw new Error(made.message);
		try {
			const known: number[] = [];
			const unknown: number[] = [];
			for (let round = 0; round < ROUNDS + 1; round++) {
				let t0 = performance.now();
				await signInWithPassword(email, 'wrong password!', address());
				const k = performance.now() - t0;
				t0 = performance.now();
				await signInWithPassword(`nobody-${round}-${randomBytes(3).toString('hex')}@bench.example`, 'wrong password!', address());
				const u = performance.now() - t0;
				// the first round warms argon2 and the pool
				if (round > 0) {
					known.push(k);
					unknown.push(u);
				}
			}
			const ratio = median(unknown) / median(known);
			const ok = ratio >= MIN_RATIO;
			return {
				ok,
				lines: [
					`known address:   median ${ms(median(known))}`,
					`unknown address: median ${ms(median(unknown))}`,
					`unknown / known ${ratio.toFixed(2)} (target ≥ ${MIN_RATIO}) ${ok ? 'OK' : 'MISSED'}`
				]
			};
		} finally {
			await db.execute(sql`delete from users where email = ${email}`);
			await db.execute(sql`delete from sign_in_throttle where key like ${'%bench%'} or key like ${'address:2001:db8:%'}`);
		}
	}
};
