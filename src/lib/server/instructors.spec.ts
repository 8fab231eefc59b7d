// The demo course's instructor has a public profile that says it is invented, with a drawn portrait of our own.
import { readFile } from 'node:fs/promises';
import { describe, expect, it } from 'vitest';
import { illustration } from '$lib/illustrations';
import { instructorBySlug, instructorForCourse, publishedCoursesOf } from './instructors';

describe('instructor profiles', () => {
	it('finds the demo course’s instructor, named as the course names them, invented and drawn', async () => {
		const course = JSON.parse(await readFile('content/daylight-flash-for-action/course.json', 'utf8'));
		const profile = instructorForCourse(course.slug);
		expect(profile).not.toBeNull();
		expect(course.instructor).toContain(profile!.name);
		expect(profile!.invented).toBe(true);
		expect(illustration(profile!.portrait)?.kind).toBe('drawn');
		expect(profile!.portraitAlt.length).toBeGreaterThan(20);
		expect(instructorBySlug(profile!.slug)).toBe(profile);
	});

	it('lists the published courses a profile teaches, from the database', async () => {
		const profile = instructorBySlug('jun-halvorsen')!;
		const listed = await publishedCoursesOf(profile);
		expect(listed.map((c) => c.slug)).toEqual(['daylight-flash-for-action']);
		expect(await publishedCoursesOf({ ...profile, courses: ['no-such-course'] })).toEqual([]);
	});

	it('has no profile for an unknown slug or course', () => {
		expect(instructorBySlug('nobody')).toBeNull();
		expect(instructorForCourse('no-such-course')).toBeNull();
	});
});
