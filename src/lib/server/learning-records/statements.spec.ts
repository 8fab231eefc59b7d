import { describe, expect, test } from 'vitest';
import validation from '@learninglocker/xapi-validation';
import { attemptSubmitted, courseCompleted, critiqueReceived, lessonCompleted, quizAnswered, verdictReceived, type RecordedStatement } from './statements';

// the validator is CommonJS with its function on `default`
const validate = ((validation as unknown as { default?: typeof validation }).default ?? validation) as (s: unknown) => { path: string[] }[];

const origin = 'https://school.example';
const at = new Date('2026-12-03T09:00:00.000Z');
const course = { id: 1, slug: 'daylight-flash-for-action', title: 'Daylight Flash for Action' };
const lesson = { id: 9, slug: 'off-the-axis', title: 'Off the axis', course };
const assignment = { slug: 'off-the-axis', title: 'Off the axis', course };
const attemptId = '0b5d7c2e-1f3a-4c6b-9d8e-7a6b5c4d3e2f';

const all: Record<string, RecordedStatement> = {
	'lesson completed': lessonCompleted(origin, 'user-1', lesson, at),
	'quiz answered': quizAnswered(origin, 'user-1', lesson, { id: 'q1', answer: '2', correct: true }, at),
	'attempt submitted': attemptSubmitted(origin, 'user-1', assignment, attemptId, at),
	'verdict pass': verdictReceived(origin, 'user-1', assignment, attemptId, { verdict: 'pass', criteria: { passed: 3, total: 3 }, decidedBy: { kind: 'grading' } }, at),
	'verdict fail': verdictReceived(origin, 'user-1', assignment, attemptId, { verdict: 'fail', criteria: { passed: 1, total: 3 }, decidedBy: { kind: 'grading' } }, at),
	'verdict needs review': verdictReceived(origin, 'user-1', assignment, attemptId, { verdict: 'needs-review', criteria: { passed: 2, total: 3 }, decidedBy: { kind: 'mentor', mentorId: 'mentor-1', overrideId: 4 } }, at),
	'critique received': critiqueReceived(origin, 'user-1', assignment, attemptId, { mentorId: 'mentor-1', rubric: { moment: 4 } }, at),
	'course completed': courseCompleted(origin, 'user-1', course, at)
};

describe('the statements Stopwise writes', () => {
	test.each(Object.entries(all))('%s is a valid xAPI 1.0.3 statement with the required fields', (_name, statement) => {
		// @learninglocker/xapi-validation checks the xAPI 1.0.3 statement rules (required properties, IRIs, UUIDs, scores)
		expect(validate(statement)).toEqual([]);
		// xAPI 1.0.3 §2.4: actor, verb (with an IRI id) and object are required; the id is a UUID
		expect(statement.id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-5[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
		expect(statement.verb.id).toMatch(/^https?:\/\//);
		expect((statement.object as { id: string }).id).toMatch(/^https:\/\/school\.example\/xapi\/activities\//);
		expect(statement.timestamp).toBe('2026-12-03T09:00:00.000Z');
	});

	test('the learner is an account on our origin named by user id, never an e-mail address', () => {
		for (const statement of Object.values(all)) {
			expect(statement.actor).toEqual({ objectType: 'Agent', account: { homePage: origin, name: 'user-1' } });
			expect(JSON.stringify(statement)).not.toContain('mbox');
		}
	});

	test('ADL verbs where ADL has one, our own IRI where it has not', () => {
		expect(all['lesson completed'].verb.id).toBe('http://adlnet.gov/expapi/verbs/completed');
		expect(all['quiz answered'].verb.id).toBe('http://adlnet.gov/expapi/verbs/answered');
		expect(all['attempt submitted'].verb.id).toBe('http://adlnet.gov/expapi/verbs/attempted');
		expect(all['verdict pass'].verb.id).toBe('http://adlnet.gov/expapi/verbs/passed');
		expect(all['verdict fail'].verb.id).toBe('http://adlnet.gov/expapi/verbs/failed');
		expect(all['verdict needs review'].verb.id).toBe(`${origin}/xapi/verbs/referred-to-mentor`);
		expect(all['critique received'].verb.id).toBe(`${origin}/xapi/verbs/received-critique`);
		expect(all['course completed'].verb.id).toBe('http://adlnet.gov/expapi/verbs/completed');
	});

	test('a verdict carries success and the share of criteria passed as its score', () => {
		expect(all['verdict fail'].result).toEqual({ completion: true, success: false, score: { raw: 1, min: 0, max: 3, scaled: 0.333 } });
		expect(all['verdict needs review'].result?.success).toBeUndefined();
		expect(all['verdict needs review'].context?.instructor).toEqual({ objectType: 'Agent', account: { homePage: origin, name: 'mentor-1' } });
	});

	test('an event recorded twice keeps one id; a mentor’s change of verdict is a statement of its own', () => {
		expect(lessonCompleted(origin, 'user-1', lesson, new Date()).id).toBe(all['lesson completed'].id);
		expect(all['verdict needs review'].id).not.toBe(all['verdict pass'].id);
		expect(all['verdict pass'].id).toBe(all['verdict fail'].id);
	});
});
