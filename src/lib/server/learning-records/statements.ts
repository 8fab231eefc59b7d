// The xAPI 1.0.3 statements Stopwise writes, built from plain facts: ADL verbs where one exists, our own IRIs otherwise.
// The actor is an account (homePage = our origin, name = the user id), never an e-mail address, so the LRS learns
// nobody's address; the school maps ids to people in Stopwise itself.
import type { Statement } from '@xapi/xapi';
import { statementIdFor } from './ids';

/** ADL's registered verbs (the ADL vocabulary, http://adlnet.gov/expapi/verbs/…). */
const ADL_VERB = 'http://adlnet.gov/expapi/verbs/';
/** ADL's activity types (http://adlnet.gov/expapi/activities/…). */
const ADL_TYPE = 'http://adlnet.gov/expapi/activities/';

export type RecordedStatement = Statement & { id: string; timestamp: string };

export interface CourseRef {
	id: number;
	slug: string;
	title: string;
}
export interface LessonRef {
	id: number;
	slug: string;
	title: string;
	course: CourseRef;
}
export interface AssignmentRef {
	slug: string;
	title: string;
	course: CourseRef;
}
export type VerdictName = 'pass' | 'fail' | 'needs-review';

const lang = (text: string) => ({ en: text });

/** Our IRIs under one origin: activities, our own verbs and extensions. */
export function iris(origin: string) {
	const base = `${origin}/xapi`;
	const part = encodeURIComponent;
	return {
		course: (c: { slug: string }) => `${base}/activities/course/${part(c.slug)}`,
		lesson: (l: { slug: string; course: { slug: string } }) => `${base}/activities/lesson/${part(l.course.slug)}/${part(l.slug)}`,
		quiz: (l: { slug: string; course: { slug: string } }, quizId: string) => `${base}/activities/quiz/${part(l.course.slug)}/${part(l.slug)}/${part(quizId)}`,
		assignment: (a: { slug: string }) => `${base}/activities/assignment/${part(a.slug)}`,
		verb: (name: string) => `${base}/verbs/${name}`,
		extension: (name: string) => `${base}/extensions/${name}`
	};
}

function agent(origin: string, userId: string) {
	return { objectType: 'Agent' as const, account: { homePage: origin, name: userId } };
}

function activity(id: string, type: string, name: string) {
	return { objectType: 'Activity' as const, id, definition: { type, name: lang(name) } };
}

function courseActivity(origin: string, course: CourseRef) {
	return activity(iris(origin).course(course), `${ADL_TYPE}course`, course.title);
}

function context(origin: string, parents: ReturnType<typeof activity>[], extensions?: Record<string, unknown>) {
	return {
		platform: 'Stopwise',
		language: 'en',
		...(parents.length ? { contextActivities: { parent: parents } } : {}),
		...(extensions ? { extensions } : {})
	};
}

export function lessonCompleted(origin: string, userId: string, lesson: LessonRef, at: Date): RecordedStatement {
	const iri = iris(origin);
	return {
		id: statementIdFor('lesson-completed', userId, lesson.id),
		actor: agent(origin, userId),
		verb: { id: `${ADL_VERB}completed`, display: lang('completed') },
		object: activity(iri.lesson(lesson), `${ADL_TYPE}lesson`, lesson.title),
		result: { completion: true },
		context: context(origin, [courseActivity(origin, lesson.course)]),
		timestamp: at.toISOString()
	};
}

export function quizAnswered(origin: string, userId: string, lesson: LessonRef, quiz: { id: string; answer: string; correct: boolean }, at: Date): RecordedStatement {
	const iri = iris(origin);
	return {
		id: statementIdFor('quiz-answered', userId, lesson.id, quiz.id, at.toISOString()),
		actor: agent(origin, userId),
		verb: { id: `${ADL_VERB}answered`, display: lang('answered') },
		object: activity(iri.quiz(lesson, quiz.id), `${ADL_TYPE}question`, `${lesson.title}: quiz ${quiz.id}`),
		result: { success: quiz.correct, response: quiz.answer },
		context: context(origin, [activity(iri.lesson(lesson), `${ADL_TYPE}lesson`, lesson.title), courseActivity(origin, lesson.course)]),
		timestamp: at.toISOString()
	};
}

function assignmentContext(origin: string, assignment: AssignmentRef, attemptId: string, extra: Record<string, unknown> = {}) {
	return context(origin, [courseActivity(origin, assignment.course)], { [iris(origin).extension('attempt')]: attemptId, ...extra });
}

function assignmentActivity(origin: string, assignment: AssignmentRef) {
	return activity(iris(origin).assignment(assignment), `${ADL_TYPE}assessment`, assignment.title);
}

export function attemptSubmitted(origin: string, userId: string, assignment: AssignmentRef, attemptId: string, at: Date): RecordedStatement {
	return {
		id: statementIdFor('attempt-submitted', attemptId),
		actor: agent(origin, userId),
		verb: { id: `${ADL_VERB}attempted`, display: lang('attempted') },
		object: assignmentActivity(origin, assignment),
		context: assignmentContext(origin, assignment, attemptId),
		timestamp: at.toISOString()
	};
}

export interface VerdictFacts {
	verdict: VerdictName;
	/** criteria that passed, of all criteria graded */
	criteria: { passed: number; total: number };
	/** who decided: the automatic grading, or a mentor's change (with the change's own key) */
	decidedBy: { kind: 'grading' } | { kind: 'mentor'; mentorId: string; overrideId: number };
}

/**
 * A verdict: ADL "passed" or "failed"; "needs-review" has no ADL verb, so it is our own "referred to a mentor".
 * The score is the share of criteria passed (scaled 0–1, as xAPI requires).
 */
export function verdictReceived(origin: string, userId: string, assignment: AssignmentRef, attemptId: string, facts: VerdictFacts, at: Date): RecordedStatement {
	const iri = iris(origin);
	const verb =
		facts.verdict === 'pass'
			? { id: `${ADL_VERB}passed`, display: lang('passed') }
			: facts.verdict === 'fail'
				? { id: `${ADL_VERB}failed`, display: lang('failed') }
				: { id: iri.verb('referred-to-mentor'), display: lang('was referred to a mentor on') };
	const { passed, total } = facts.criteria;
	const mentor = facts.decidedBy.kind === 'mentor' ? facts.decidedBy : null;
	const base = assignmentContext(origin, assignment, attemptId, { [iri.extension('verdict')]: facts.verdict, [iri.extension('decided-by')]: mentor ? 'mentor' : 'grading' });
	return {
		id: mentor ? statementIdFor('verdict', attemptId, 'override', mentor.overrideId) : statementIdFor('verdict', attemptId, 'grading'),
		actor: agent(origin, userId),
		verb,
		object: assignmentActivity(origin, assignment),
		result: {
			completion: true,
			...(facts.verdict === 'needs-review' ? {} : { success: facts.verdict === 'pass' }),
			...(total > 0 ? { score: { raw: passed, min: 0, max: total, scaled: Math.round((passed / total) * 1000) / 1000 } } : {})
		},
		context: mentor ? { ...base, instructor: agent(origin, mentor.mentorId) } : base,
		timestamp: at.toISOString()
	};
}

/** A mentor's critique reaching the learner (our own verb; the mentor is the context's instructor). Rubric scores, not the text. */
export function critiqueReceived(origin: string, userId: string, assignment: AssignmentRef, attemptId: string, critique: { mentorId: string; rubric: Record<string, number> }, at: Date): RecordedStatement {
	const iri = iris(origin);
	return {
		id: statementIdFor('critique', attemptId),
		actor: agent(origin, userId),
		verb: { id: iri.verb('received-critique'), display: lang('received a critique on') },
		object: assignmentActivity(origin, assignment),
		context: { ...assignmentContext(origin, assignment, attemptId, { [iri.extension('rubric')]: critique.rubric }), instructor: agent(origin, critique.mentorId) },
		timestamp: at.toISOString()
	};
}

/** Every published lesson of the course completed (ADL "completed" on the course). */
export function courseCompleted(origin: string, userId: string, course: CourseRef, at: Date): RecordedStatement {
	return {
		id: statementIdFor('course-completed', userId, course.id),
		actor: agent(origin, userId),
		verb: { id: `${ADL_VERB}completed`, display: lang('completed') },
		object: courseActivity(origin, course),
		result: { completion: true },
		context: context(origin, []),
		timestamp: at.toISOString()
	};
}
