import { describe, expect, test } from 'vitest';
import { sql } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { seedDemo } from '$lib/server/seed';

const tables = ['users', 'courses', 'modules', 'lessons', 'assignments'] as const;

async function snapshot() {
	const counts: Record<string, number> = {};
	for (const t of tables) {
		const [row] = await db.execute<{ n: number }>(sql.raw(`select count(*)::int as n from ${t}`));
		counts[t] = row.n;
	}
	const [users] = await db.execute<{ h: string }>(sql`select string_agg(password_hash, ',' order by email) as h from users`);
	return { counts, passwordHashes: users.h };
}

describe('demo seed', () => {
	test('a second run changes nothing', async () => {
		await seedDemo(db);
		const first = await snapshot();
		await seedDemo(db);
		const second = await snapshot();
		expect(second).toEqual(first);
		expect(first.counts.courses).toBeGreaterThanOrEqual(1);
		expect(first.counts.lessons).toBeGreaterThanOrEqual(1);
		expect(first.counts.users).toBe(4);
	});

	test('a demo person whose invented name changed is renamed in a kept database; other names are left alone', async () => {
		await seedDemo(db);
		await db.execute(sql`update users set name = 'Old Invented Name (demo)' where email = 'admin@harborlane.example'`);
		await db.execute(sql`update users set name = 'Chosen by the learner' where email = 'learner@harborlane.example'`);
		try {
			await seedDemo(db);
			const rows = await db.execute<{ email: string; name: string }>(sql`select email, name from users order by email`);
			const byEmail = Object.fromEntries(rows.map((r) => [r.email, r.name]));
			expect(byEmail['admin@harborlane.example']).toBe('Maren Tolliver (demo)');
			expect(byEmail['learner@harborlane.example']).toBe('Chosen by the learner');
		} finally {
			await db.execute(sql`update users set name = 'Robin Okafor (demo)' where email = 'learner@harborlane.example'`);
		}
	});

	test('a lesson edited in the browser is not overwritten by the seed', async () => {
		await seedDemo(db);
		await db.execute(sql`update lessons set source = 'db', title = 'Edited in the browser' where slug = 'what-a-stop-is'`);
		try {
			await seedDemo(db);
			const [row] = await db.execute<{ title: string }>(sql`select title from lessons where slug = 'what-a-stop-is'`);
			expect(row.title).toBe('Edited in the browser');
		} finally {
			await db.execute(sql`update lessons set source = 'file' where slug = 'what-a-stop-is'`);
			await seedDemo(db);
		}
	});

	test('the school’s signing key for certificates is made once: later runs keep the same one', async () => {
		await seedDemo(db);
		const first = await db.execute<{ kid: string }>(sql`select kid from issuer_keys where active`);
		await seedDemo(db);
		const second = await db.execute<{ kid: string }>(sql`select kid from issuer_keys where active`);
		expect(first).toHaveLength(1);
		expect(second.map((r) => r.kid)).toEqual(first.map((r) => r.kid));
	});
});
