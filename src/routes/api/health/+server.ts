import { json } from '@sveltejs/kit';
import { version } from '$app/environment';
import { sql } from 'drizzle-orm';
import { db } from '$lib/server/db';

export const GET = async () => {
	const dbOk = await db
		.execute(sql`select 1`)
		.then(() => true)
		.catch(() => false);
	return json({ ok: dbOk, db: dbOk ? 'up' : 'down', version }, { status: dbOk ? 200 : 503 });
};
