// Seeds the invented demo (course files from content/, demo people); running it again changes nothing.
import { readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { randomBytes } from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { Db } from './db';
import { assignments, coupons, courses, lessons, modules, users, type Role } from './db/schema';
import { readCatalogue } from './lessons/catalogue';
import { hashPassword } from './password';
import { ensureIssuerKey } from './credentials/keys';
import { seedDemoFieldDays } from './field-days/demo';
import { seedDemoCohort } from './cohorts/demo';

type DemoAccount = { role: Role; name: string; email: string; password: string; roles: Role[] };

export async function seedDemo(db: Db, root = process.cwd()): Promise<void> {
	const catalogue = await readCatalogue(root);
	await db.transaction(async (tx) => {
		for (const course of catalogue) {
			const [{ id: courseId }] = await tx
				.insert(courses)
				.values({
					slug: course.slug,
					title: course.title,
					summary: course.summary,
					instructor: course.instructor,
					priceCents: course.priceCents,
					currency: course.currency
				})
				.onConflictDoUpdate({
					target: courses.slug,
					set: { title: course.title, summary: course.summary, instructor: course.instructor }
				})
				.returning({ id: courses.id });

			const moduleIds = new Map<string, number>();
			for (const [i, m] of course.modules.entries()) {
				const [{ id }] = await tx
					.insert(modules)
					.values({ courseId, slug: m.slug, title: m.title, summary: m.summary, position: i + 1 })
					.onConflictDoUpdate({
						target: [modules.courseId, modules.slug],
						set: { title: m.title, summary: m.summary }
					})
					.returning({ id: modules.id });
				moduleIds.set(m.slug, id);
			}

			for (const lesson of course.lessons) {
				const moduleId = moduleIds.get(lesson.module)!;
				const fields = {
					title: lesson.title,
					summary: lesson.summary,
					freePreview: lesson.preview,
					minutes: lesson.minutes,
					contentPath: lesson.contentPath
				};
				// a lesson edited in the browser (source 'db') belongs to its author now: leave it alone
				const [row] = await tx
					.insert(lessons)
					.values({ moduleId, slug: lesson.slug, position: lesson.order, source: 'file', ...fields })
					.onConflictDoUpdate({
						target: [lessons.moduleId, lessons.slug],
						set: fields,
						setWhere: eq(lessons.source, 'file')
					})
					.returning({ id: lessons.id });
				// no row back: the lesson is the author's (source 'db'), and so are its assignments
				if (!row) continue;
				const lessonId = row.id;
				for (const [i, a] of lesson.assignments.entries()) {
					await tx
						.insert(assignments)
						.values({ lessonId, slug: a.slug, title: a.title, brief: a.brief, spec: a.spec, position: i })
						.onConflictDoUpdate({
							target: assignments.slug,
							set: { title: a.title, brief: a.brief, spec: a.spec }
						});
				}
			}
		}

		const demo: DemoAccount[] = JSON.parse(await readFile(join(root, 'scripts', 'demo-accounts.json'), 'utf8'));
		for (const person of demo) {
			const existing = await tx.query.users.findFirst({ where: eq(users.email, person.email) });
			if (existing) {
				// a renamed demo person (names are invented and may change) is renamed in kept databases too
				if (existing.name !== person.name && existing.name.endsWith('(demo)')) {
					await tx.update(users).set({ name: person.name }).where(eq(users.id, existing.id));
				}
				continue;
			}
			await tx.insert(users).values({
				id: randomBytes(15).toString('base64url'),
				email: person.email,
				name: person.name,
				passwordHash: await hashPassword(person.password),
				emailVerified: true,
				roles: person.roles
			});
		}

		// one invented demo coupon to try at checkout; a second seed leaves the existing row as it is
		await tx.insert(coupons).values({ code: 'HARBOR20', percentOff: 20 }).onConflictDoNothing();

		// the school's signing key for certificates, made on the first start and kept from then on
		await ensureIssuerKey(tx);
	});
	// the demo's field days name its course, Assignments and mentor, so they come after them
	await seedDemoFieldDays(db);
	await seedDemoCohort(db);
}
