// The course page's message after a checkout or a locked lesson: only known values produce text.
import { describe, expect, test } from 'vitest';
import { readCourseNotice } from './course-page';

const modules = [{ lessons: [{ slug: 'what-a-stop-is', title: 'What a stop is' }, { slug: 'metering-the-sky', title: 'Metering the sky' }] }];
const notice = (query: string) => readCourseNotice(new URLSearchParams(query), modules);

describe('readCourseNotice', () => {
	test('a cancelled or declined checkout says nothing was charged', () => {
		expect(notice('checkout=cancelled')).toMatchObject({ tone: 'error', text: expect.stringMatching(/nothing was charged and you are not enrolled/) });
	});

	test('a locked lesson is named by its title', () => {
		expect(notice('locked=metering-the-sky')).toEqual({ tone: 'info', text: '“Metering the sky” opens once you are enrolled in this course.' });
	});

	test('unknown values and lessons give no message (nothing from the URL is echoed)', () => {
		expect(notice('checkout=<script>')).toBeNull();
		expect(notice('locked=<b>not-a-lesson</b>')).toBeNull();
		expect(notice('')).toBeNull();
	});
});
