// `npm run db:seed`: the invented demo scenario, idempotently.
import { client, db } from '../src/lib/server/db/index';
import { seedDemo } from '../src/lib/server/seed';

try {
	await seedDemo(db);
} finally {
	await client.end();
}
