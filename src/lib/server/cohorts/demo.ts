// The invented demo cohort of Harbor Lane Athletics (people and dates made up); seeding twice changes nothing.
import { eq, inArray } from 'drizzle-orm';
import type { Db } from '../db';
import { assignments, cohortDueDates, cohortMembers, cohorts, courses, users } from '../db/schema';

const SLUG = 'spring-evenings-2027';
const dues: [assignment: string, dueAt: string][] = [
	['three-rungs', '2027-03-14T23:00:00Z'],
	['dim-the-sky', '2027-03-28T23:00:00Z'],
	['off-the-axis', '2027-04-11T23:00:00Z'],
	['freeze-the-moment', '2027-05-16T23:00:00Z']
];

export async function seedDemoCohort(db: Db): Promise<void> {
	const course = await db.query.courses.findFirst({ where: eq(courses.slug, 'daylight-flash-for-action') });
	const mentor = await db.query.users.findFirst({ where: eq(users.email, 'mentor@harborlane.example') });
	const learner = await db.query.users.findFirst({ where: eq(users.email, 'learner@harborlane.example') });
	if (!course || !learner) return;
	await db
		.insert(cohorts)
		.values({ slug: SLUG, title: 'Spring evenings 2027 (demo)', courseId: course.id, mentorId: mentor?.id ?? null, startsAt: new Date('2027-03-01T23:00:00Z') })
		.onConflictDoNothing({ target: cohorts.slug });
	const cohort = (await db.query.cohorts.findFirst({ where: eq(cohorts.slug, SLUG) }))!;
	await db.insert(cohortMembers).values({ cohortId: cohort.id, userId: learner.id }).onConflictDoNothing();
	const found = await db.select({ id: assignments.id, slug: assignments.slug }).from(assignments).where(inArray(assignments.slug, dues.map(([s]) => s)));
	for (const [slug, dueAt] of dues) {
		const a = found.find((f) => f.slug === slug);
		if (a) await db.insert(cohortDueDates).values({ cohortId: cohort.id, assignmentId: a.id, dueAt: new Date(dueAt) }).onConflictDoNothing();
	}
}
