// The demo learner enrolled directly (payments are another feature) for specs that send Attempts, their Attempts removed
// before and after, and the frame pair those specs send.
import { test } from '@playwright/test';
import { rm } from 'node:fs/promises';
import { join } from 'node:path';
import postgres from 'postgres';
import { makeFrame, REFERENCE_EXIF } from '../../../src/lib/server/analysis/test-frames';
import { COURSE, demoAccount } from './screens';

/**
 * Registers hooks that enrol the demo learner in the demo course for the spec and remove their Attempts (rows, files
 * and unfinished uploads) before and after it, on a connection of their own. Call at the top level of a spec.
 */
export function enrolDemoLearner(): { readonly id: string; removeAttempts: () => Promise<void> } {
	const sql = postgres(process.env.DATABASE_URL ?? 'postgres://stopwise@127.0.0.1:54329/stopwise', { max: 1, onnotice: () => {} });
	let learnerId = '';
	let courseId = 0;
	const removeAttempts = async () => {
		const rows = await sql<{ id: string }[]>`delete from attempts where user_id = ${learnerId} returning id`;
		const dir = process.env.STOPWISE_DATA_DIR ?? join('.data', 'files');
		await Promise.all(rows.map((r) => rm(join(dir, 'attempts', r.id), { recursive: true, force: true })));
		await sql`delete from frame_uploads where user_id = ${learnerId}`;
	};
	test.beforeAll(async () => {
		[{ id: learnerId }] = await sql<{ id: string }[]>`select id from users where email = ${demoAccount('learner').email}`;
		[{ id: courseId }] = await sql<{ id: number }[]>`select id from courses where slug = ${COURSE}`;
		await sql`insert into enrolments (user_id, course_id, source) values (${learnerId}, ${courseId}, 'admin') on conflict do nothing`;
		await removeAttempts();
	});
	test.afterAll(async () => {
		await removeAttempts();
		await sql`delete from enrolments where user_id = ${learnerId} and course_id = ${courseId} and source = 'admin'`;
		await sql.end();
	});
	return {
		get id() {
			return learnerId;
		},
		removeAttempts
	};
}

/**
 * A pair for "Off the axis": reference 1/500 s, lit 1/1500 s (log2(3) ≈ 1.6 stops under, APEX), the subject relit to its
 * reference level. `flash` is the lit frame's Exif Flash value (0x19: fired, auto mode).
 */
export async function framePair({ width = 900, height = 600, flash = 0x19 } = {}): Promise<{ reference: Buffer; lit: Buffer }> {
	const reference = await makeFrame({ width, height, subject: { stops: 0 }, background: { stops: 0.5 }, exif: { ...REFERENCE_EXIF } });
	const lit = await makeFrame({
		width,
		height,
		subject: { stops: 0 },
		background: { stops: 0.5 - Math.log2(3) },
		exif: { ...REFERENCE_EXIF, exposureTime: 1 / 1500, flash }
	});
	return { reference, lit };
}
