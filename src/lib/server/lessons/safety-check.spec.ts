// The Safety note check: which topics a lesson's source names, and the error that names the file when one is missing.
import { describe, expect, it } from 'vitest';
import { assertSafetyTopics, missingSafetyTopics, safetyTopicsIn } from './safety-check';

const lesson = (...notes: string[]) => ['Some text.', '', ...notes.map((t) => `<SafetyNote topics="${t}" />`), '', 'More.'].join('\n');

describe('safety topics in a lesson', () => {
	it('collects the topics of every Safety note, trimmed', () => {
		expect([...safetyTopicsIn(lesson('stands, eyes', 'water'))]).toEqual(['stands', 'eyes', 'water']);
		expect(safetyTopicsIn('No notes here, only <Quiz id="q" question="Safety?" answer="1" />').size).toBe(0);
	});

	it('lists the required topics no note names, in the order they were required', () => {
		expect(missingSafetyTopics(['heat', 'stands', 'thunder'], lesson('stands'))).toEqual(['heat', 'thunder']);
		expect(missingSafetyTopics([], lesson())).toEqual([]);
	});

	it('throws naming the file and the missing cautions', () => {
		expect(() => assertSafetyTopics('content/x/lessons/08-near.svx', ['stands', 'eyes'], lesson('general'))).toThrow(
			/08-near\.svx: .*cautions stands, eyes/
		);
		expect(() => assertSafetyTopics('a.svx', ['water'], lesson('water,rain'))).not.toThrow();
	});
});
