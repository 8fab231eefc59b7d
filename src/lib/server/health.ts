// Whether the app can reach its database: the work behind /api/health, without Kit's modules so scripts can serve it too.
import { sql } from 'drizzle-orm';
import { db } from './db/index';

export async function checkHealth(): Promise<{ ok: boolean; db: 'up' | 'down' }> {
	const ok = await db
		.execute(sql`select 1`)
		.then(() => true)
		.catch(() => false);
	return { ok, db: ok ? 'up' : 'down' };
}
