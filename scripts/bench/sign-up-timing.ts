// Benchmark: the sign-up form's work before it answers costs the same for a taken address as for a new one (the
// password is hashed either way; the mail goes after the answer), so the answer's timing does not tell which exists.
import { randomBytes } from 'node:crypto';
import { inArray } from 'drizzle-orm';
import { db } from '../../src/lib/server/db/index';
import { users } from '../../src/lib/server/db/schema';
import { signUp } from '../../src/lib/server/accounts';
import { median, ms, type Bench } from './timing';

const ROUNDS = 7;
/** Without hashing for a taken address it answers in about a millisecond against a full argon2id hash for a new one. */
const BAND = [0.5, 2] as const;

const person = (email: string) => ({ name: 'Bench person (invented)', email, password: 'a long bench passphrase' });

export const signUpTimingBench: Bench = {
	name: 'sign-up: taken address against new address',
	async run() {
		const taken = `bench-signup-${randomBytes(4).toString('hex')}@bench.example`;
		const made = [taken];
		await signUp(person(taken));
		try {
			const fresh: number[] = [];
			const again: number[] = [];
			for (let round = 0; round < ROUNDS + 1; round++) {
				const email = `bench-signup-${round}-${randomBytes(3).toString('hex')}@bench.example`;
				made.push(email);
				let t0 = performance.now();
				await signUp(person(email));
				const f = performance.now() - t0;
				t0 = performance.now();
				await signUp(person(taken));
				const t = performance.now() - t0;
				// the first round warms argon2 and the pool
				if (round > 0) {
					fresh.push(f);
					again.push(t);
				}
			}
			const ratio = median(again) / median(fresh);
			const ok = ratio >= BAND[0] && ratio <= BAND[1];
			return {
				ok,
				lines: [
					`new address:   median ${ms(median(fresh))}`,
					`taken address: median ${ms(median(again))}`,
					`taken / new ${ratio.toFixed(2)} (target ${BAND[0]}–${BAND[1]}) ${ok ? 'OK' : 'MISSED'}`
				]
			};
		} finally {
			await db.delete(users).where(inArray(users.email, made));
		}
	}
};
