// Applies the committed drizzle-kit migrations in drizzle/ to DATABASE_URL.
import { drizzle } from 'drizzle-orm/postgres-js';
import { migrate } from 'drizzle-orm/postgres-js/migrator';
import postgres from 'postgres';

const sql = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
try {
	await migrate(drizzle(sql), { migrationsFolder: 'drizzle' });
} finally {
	await sql.end();
}
