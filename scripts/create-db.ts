// Creates the database named in DATABASE_URL when it is missing; with --fresh, drops it first.
import postgres from 'postgres';

const url = new URL(process.env.DATABASE_URL!);
const name = decodeURIComponent(url.pathname.slice(1));
if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new Error(`unexpected database name ${name}`);
url.pathname = '/postgres';
const sql = postgres(url.toString(), { max: 1, onnotice: () => {} });
try {
	if (process.argv.includes('--fresh')) await sql.unsafe(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
	const [row] = await sql`SELECT 1 AS ok FROM pg_database WHERE datname = ${name}`;
	if (!row) await sql.unsafe(`CREATE DATABASE ${name}`);
} finally {
	await sql.end();
}
