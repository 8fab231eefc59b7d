// What the upload benches set up in the database: an invented learner enrolled in the Assignment's course.
import { randomUUID } from 'node:crypto';
import { db } from '../../src/lib/server/db/index';
import { enrolments, users } from '../../src/lib/server/db/schema';

/** A new learner (id `<label>-xxxxxxxx`) enrolled by hand; the bench deletes it when done. */
export async function enrolledBenchLearner(label: string, name: string, courseId: number): Promise<string> {
	const userId = `${label}-${randomUUID().slice(0, 8)}`;
	await db.insert(users).values({ id: userId, email: `${userId}@bench.example`, name });
	await db.insert(enrolments).values({ userId, courseId, source: 'admin' });
	return userId;
}
