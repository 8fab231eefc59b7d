// The one PostgreSQL pool of the process (postgres-js) and its Drizzle handle.
import { drizzle } from 'drizzle-orm/postgres-js';
import postgres from 'postgres';
import * as schema from './schema';

export const databaseUrl = process.env.DATABASE_URL ?? 'postgres://stopwise@127.0.0.1:54329/stopwise';

export const client = postgres(databaseUrl, { max: 10, onnotice: () => {} });
export const db = drizzle(client, { schema });
export type Db = typeof db;
