// Drizzle schema: camelCase keys over snake_case columns; row types exported beside each table.
import { sql } from 'drizzle-orm';
import type { AssignmentSpecInput, ClipRendition, PlanLayout, StoredAnalysis, StoredResult, SubjectBox } from './json-types';
import {
	bigint,
	boolean,
	check,
	index,
	integer,
	jsonb,
	pgTable,
	primaryKey,
	real,
	serial,
	text,
	timestamp,
	uniqueIndex
} from 'drizzle-orm/pg-core';

// one list for server and browser: pages cannot import this server module
import { roles, type Role } from '../../roles';
export { roles, type Role };

export const users = pgTable('users', {
	id: text('id').primaryKey(),
	email: text('email').notNull().unique(),
	name: text('name').notNull(),
	passwordHash: text('password_hash'),
	emailVerified: boolean('email_verified').notNull().default(false),
	roles: text('roles').array().$type<Role[]>().notNull().default(sql`'{learner}'::text[]`),
	createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
});
export type User = typeof users.$inferSelect;

export const sessions = pgTable(
	'sessions',
	{
		id: text('id').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		expiresAt: timestamp('expires_at', { withTimezone: true, mode: 'date' }).notNull()
	},
	(t) => [index('sessions_user_idx').on(t.userId)]
);
export type Session = typeof sessions.$inferSelect;

export const courses = pgTable('courses', {
	id: serial('id').primaryKey(),
	slug: text('slug').notNull().unique(),
	title: text('title').notNull(),
	summary: text('summary').notNull(),
	instructor: text('instructor').notNull(),
	priceCents: integer('price_cents').notNull().default(0),
	currency: text('currency').notNull().default('usd'),
	published: boolean('published').notNull().default(true),
	createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
});
export type Course = typeof courses.$inferSelect;

export const modules = pgTable(
	'modules',
	{
		id: serial('id').primaryKey(),
		courseId: integer('course_id')
			.notNull()
			.references(() => courses.id, { onDelete: 'cascade' }),
		slug: text('slug').notNull(),
		title: text('title').notNull(),
		summary: text('summary').notNull().default(''),
		position: integer('position').notNull()
	},
	(t) => [uniqueIndex('modules_course_slug_idx').on(t.courseId, t.slug)]
);
export type Module = typeof modules.$inferSelect;

/** A lesson's body lives either in a `content/` file (source 'file') or in the database ('db'). */
export const lessons = pgTable(
	'lessons',
	{
		id: serial('id').primaryKey(),
		moduleId: integer('module_id')
			.notNull()
			.references(() => modules.id, { onDelete: 'cascade' }),
		slug: text('slug').notNull(),
		title: text('title').notNull(),
		summary: text('summary').notNull().default(''),
		position: integer('position').notNull(),
		freePreview: boolean('free_preview').notNull().default(false),
		minutes: integer('minutes').notNull().default(10),
		source: text('source', { enum: ['file', 'db'] }).notNull().default('file'),
		contentPath: text('content_path'),
		body: text('body'),
		published: boolean('published').notNull().default(true),
		updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [uniqueIndex('lessons_module_slug_idx').on(t.moduleId, t.slug)]
);
export type Lesson = typeof lessons.$inferSelect;

export const assignments = pgTable(
	'assignments',
	{
		id: serial('id').primaryKey(),
		lessonId: integer('lesson_id')
			.notNull()
			.references(() => lessons.id, { onDelete: 'cascade' }),
		slug: text('slug').notNull().unique(),
		title: text('title').notNull(),
		brief: text('brief').notNull(),
		spec: jsonb('spec').$type<AssignmentSpecInput>().notNull(),
		position: integer('position').notNull().default(0),
		/** whether passing it is needed for the course's certificate (issue 16); the author decides, all count by default */
		countsForCredential: boolean('counts_for_credential').notNull().default(true)
	},
	(t) => [index('assignments_lesson_idx').on(t.lessonId)]
);
export type Assignment = typeof assignments.$inferSelect;

// ---- accounts (issue 5): one-time links, sign-in throttling, role audit ----

export const tokenPurposes = ['verify_email', 'reset_password', 'change_email'] as const;
export type TokenPurpose = (typeof tokenPurposes)[number];

/** One-time links sent by e-mail; only the SHA-256 of the token is stored. */
export const authTokens = pgTable(
	'auth_tokens',
	{
		tokenHash: text('token_hash').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		purpose: text('purpose', { enum: tokenPurposes }).notNull(),
		/** the address the link was sent to (for change_email: the new address) */
		email: text('email').notNull(),
		expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
		usedAt: timestamp('used_at', { withTimezone: true }),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('auth_tokens_user_idx').on(t.userId, t.purpose)]
);
export type AuthToken = typeof authTokens.$inferSelect;

/** Failed sign-ins per key ('account:<email>' or 'address:<ip>'), shared by every app process. */
export const signInThrottle = pgTable('sign_in_throttle', {
	key: text('key').primaryKey(),
	failures: integer('failures').notNull().default(0),
	lastFailureAt: timestamp('last_failure_at', { withTimezone: true }).notNull().defaultNow(),
	lockedUntil: timestamp('locked_until', { withTimezone: true })
});
export type SignInThrottle = typeof signInThrottle.$inferSelect;

/** Every change of a person's roles: who changed whose roles, from what to what, and when. */
export const roleAudit = pgTable(
	'role_audit',
	{
		id: serial('id').primaryKey(),
		targetUserId: text('target_user_id').references(() => users.id, { onDelete: 'set null' }),
		targetEmail: text('target_email').notNull(),
		actorUserId: text('actor_user_id').references(() => users.id, { onDelete: 'set null' }),
		actorEmail: text('actor_email').notNull(),
		rolesBefore: text('roles_before').array().$type<Role[]>().notNull(),
		rolesAfter: text('roles_after').array().$type<Role[]>().notNull(),
		changedAt: timestamp('changed_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('role_audit_changed_idx').on(t.changedAt), index('role_audit_target_idx').on(t.targetUserId)]
);
export type RoleAuditEntry = typeof roleAudit.$inferSelect;
// ---- end accounts ----

// ---- learning (issue 6): authored lesson versions, images, quiz answers, progress ----

/** Every saved state of a lesson written in the browser; a lesson's published body is one of these. */
export const lessonVersions = pgTable(
	'lesson_versions',
	{
		id: serial('id').primaryKey(),
		lessonId: integer('lesson_id')
			.notNull()
			.references(() => lessons.id, { onDelete: 'cascade' }),
		title: text('title').notNull(),
		summary: text('summary').notNull().default(''),
		body: text('body').notNull(),
		authorId: text('author_id').references(() => users.id, { onDelete: 'set null' }),
		note: text('note').notNull().default(''),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('lesson_versions_lesson_idx').on(t.lessonId, t.createdAt)]
);
export type LessonVersion = typeof lessonVersions.$inferSelect;

/** Images authors upload for lessons, stored as WebP. */
export const lessonImages = pgTable('lesson_images', {
	id: text('id').primaryKey(),
	authorId: text('author_id').references(() => users.id, { onDelete: 'set null' }),
	storageKey: text('storage_key').notNull(),
	width: integer('width').notNull(),
	height: integer('height').notNull(),
	alt: text('alt').notNull().default(''),
	createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
});
export type LessonImage = typeof lessonImages.$inferSelect;

export const quizAnswers = pgTable(
	'quiz_answers',
	{
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		lessonId: integer('lesson_id')
			.notNull()
			.references(() => lessons.id, { onDelete: 'cascade' }),
		quizId: text('quiz_id').notNull(),
		answer: text('answer').notNull(),
		correct: boolean('correct').notNull(),
		answeredAt: timestamp('answered_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [primaryKey({ columns: [t.userId, t.lessonId, t.quizId] })]
);
export type QuizAnswer = typeof quizAnswers.$inferSelect;

/** One row per learner and lesson opened: when last visited, and when marked complete. */
export const lessonProgress = pgTable(
	'lesson_progress',
	{
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		lessonId: integer('lesson_id')
			.notNull()
			.references(() => lessons.id, { onDelete: 'cascade' }),
		lastVisitedAt: timestamp('last_visited_at', { withTimezone: true }).notNull().defaultNow(),
		completedAt: timestamp('completed_at', { withTimezone: true })
	},
	(t) => [primaryKey({ columns: [t.userId, t.lessonId] }), index('lesson_progress_recent_idx').on(t.userId, t.lastVisitedAt)]
);
export type LessonProgress = typeof lessonProgress.$inferSelect;
// ---- end learning ----

// ---- attempts (issue 7): uploads, grading, the review queue, critique ----

export const attemptStatuses = ['queued', 'grading', 'graded', 'error'] as const;
export type AttemptStatus = (typeof attemptStatuses)[number];
export const verdicts = ['pass', 'fail', 'needs-review'] as const;
export type AttemptVerdict = (typeof verdicts)[number];

export const attempts = pgTable(
	'attempts',
	{
		id: text('id').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		assignmentId: integer('assignment_id')
			.notNull()
			.references(() => assignments.id, { onDelete: 'cascade' }),
		/** sent by the upload form; a double-clicked submit carries the same key and finds the same attempt */
		submissionKey: text('submission_key').notNull(),
		status: text('status', { enum: attemptStatuses }).notNull().default('queued'),
		/** the grader's verdict */
		autoVerdict: text('auto_verdict', { enum: verdicts }),
		/** what the learner sees: the grader's verdict, or a mentor's override */
		verdict: text('verdict', { enum: verdicts }),
		/** the spec graded against (assignments change; attempts keep what they were graded by) */
		spec: jsonb('spec').$type<AssignmentSpecInput>().notNull(),
		subjectBox: jsonb('subject_box').$type<SubjectBox>().notNull(),
		lightPlan: jsonb('light_plan').$type<PlanLayout>(),
		/** what the learner says they used (guide number, power fraction, distance in m), for a predicted subject level */
		flashUsed: jsonb('flash_used').$type<{ gn?: number; power?: number; distance?: number }>(),
		/** criteria results from grade() */
		result: jsonb('result').$type<StoredResult>(),
		error: text('error'),
		gradeRuns: integer('grade_runs').notNull().default(0),
		/** 'open' until a mentor has written a critique */
		reviewState: text('review_state', { enum: ['open', 'reviewed'] }).notNull().default('open'),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		gradedAt: timestamp('graded_at', { withTimezone: true }),
		reviewedAt: timestamp('reviewed_at', { withTimezone: true })
	},
	(t) => [
		uniqueIndex('attempts_submission_idx').on(t.userId, t.submissionKey),
		index('attempts_user_assignment_idx').on(t.userId, t.assignmentId, t.createdAt),
		index('attempts_queue_idx').on(t.reviewState, t.verdict, t.createdAt)
	]
);
export type Attempt = typeof attempts.$inferSelect;

export const attemptFrames = pgTable(
	'attempt_frames',
	{
		id: serial('id').primaryKey(),
		attemptId: text('attempt_id')
			.notNull()
			.references(() => attempts.id, { onDelete: 'cascade' }),
		name: text('name').notNull(),
		originalKey: text('original_key').notNull(),
		largeKey: text('large_key').notNull(),
		thumbKey: text('thumb_key').notNull(),
		mime: text('mime').notNull(),
		bytes: integer('bytes').notNull(),
		width: integer('width'),
		height: integer('height'),
		/** the frame as read (EXIF and pixel analysis) */
		analysis: jsonb('analysis').$type<StoredAnalysis>()
	},
	(t) => [uniqueIndex('attempt_frames_name_idx').on(t.attemptId, t.name)]
);
export type AttemptFrame = typeof attemptFrames.$inferSelect;

export const critiques = pgTable('critiques', {
	attemptId: text('attempt_id')
		.primaryKey()
		.references(() => attempts.id, { onDelete: 'cascade' }),
	mentorId: text('mentor_id').references(() => users.id, { onDelete: 'set null' }),
	text: text('text').notNull().default(''),
	/** rubric item id → score */
	rubric: jsonb('rubric').$type<Record<string, number>>().notNull().default({}),
	createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
	updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
});
export type Critique = typeof critiques.$inferSelect;

/** Numbered comments pinned on a frame, at fractions 0–1 of its width and height. */
export const pins = pgTable(
	'pins',
	{
		id: serial('id').primaryKey(),
		attemptId: text('attempt_id')
			.notNull()
			.references(() => attempts.id, { onDelete: 'cascade' }),
		frameName: text('frame_name').notNull(),
		number: integer('number').notNull(),
		x: real('x').notNull(),
		y: real('y').notNull(),
		text: text('text').notNull(),
		mentorId: text('mentor_id').references(() => users.id, { onDelete: 'set null' }),
		/** sent by the pin form; a double-clicked "Pin it" carries the same key and finds the same pin */
		clientKey: text('client_key'),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [uniqueIndex('pins_number_idx').on(t.attemptId, t.number), uniqueIndex('pins_client_key_idx').on(t.attemptId, t.clientKey)]
);
export type Pin = typeof pins.$inferSelect;

/** A mentor's override of the automatic verdict, with the reason: the audit trail. */
export const verdictOverrides = pgTable(
	'verdict_overrides',
	{
		id: serial('id').primaryKey(),
		attemptId: text('attempt_id')
			.notNull()
			.references(() => attempts.id, { onDelete: 'cascade' }),
		mentorId: text('mentor_id').references(() => users.id, { onDelete: 'set null' }),
		mentorEmail: text('mentor_email').notNull(),
		verdictBefore: text('verdict_before', { enum: verdicts }),
		verdictAfter: text('verdict_after', { enum: verdicts }).notNull(),
		reason: text('reason').notNull(),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('verdict_overrides_attempt_idx').on(t.attemptId)]
);
export type VerdictOverride = typeof verdictOverrides.$inferSelect;

export const shootPlanStatuses = ['waiting', 'approved', 'returned'] as const;
export type ShootPlanStatus = (typeof shootPlanStatuses)[number];

/** A learner's plan for a shoot, filed before an Assignment's uploads open; the newest one per learner and Assignment decides. */
export const shootPlans = pgTable(
	'shoot_plans',
	{
		id: serial('id').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		assignmentId: integer('assignment_id')
			.notNull()
			.references(() => assignments.id, { onDelete: 'cascade' }),
		lightPlan: jsonb('light_plan').$type<PlanLayout>().notNull(),
		/** the settings as the learner wrote them: shutter '1/250', aperture 'f/8', ISO, flash in words */
		settings: jsonb('settings').$type<{ shutter: string; aperture: string; iso: number; flash: string }>().notNull(),
		story: text('story').notNull(),
		/** the checklist lines as they read when the learner confirmed them */
		checklist: jsonb('checklist').$type<string[]>().notNull(),
		status: text('status', { enum: shootPlanStatuses }).notNull().default('waiting'),
		mentorId: text('mentor_id').references(() => users.id, { onDelete: 'set null' }),
		mentorNote: text('mentor_note').notNull().default(''),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		decidedAt: timestamp('decided_at', { withTimezone: true })
	},
	(t) => [index('shoot_plans_user_assignment_idx').on(t.userId, t.assignmentId, t.createdAt), index('shoot_plans_status_idx').on(t.status, t.createdAt)]
);
export type ShootPlan = typeof shootPlans.$inferSelect;
// ---- end attempts ----

// ---- enrolment (issue 8): payments, webhook events, enrolments, coupons ----

export const enrolments = pgTable(
	'enrolments',
	{
		id: serial('id').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		courseId: integer('course_id')
			.notNull()
			.references(() => courses.id, { onDelete: 'cascade' }),
		status: text('status', { enum: ['active', 'revoked'] }).notNull().default('active'),
		source: text('source', { enum: ['payment', 'admin', 'free'] }).notNull(),
		/** the latest payment that opened or kept access; every payment stays in `payments` by learner and course */
		paymentId: integer('payment_id'),
		/** the coupon that made a course free (paid enrolments keep theirs on the payment) */
		couponCode: text('coupon_code'),
		/** set while an admin's grant (or a free enrolment) holds access open: no refund takes that away */
		grantedAt: timestamp('granted_at', { withTimezone: true }),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		revokedAt: timestamp('revoked_at', { withTimezone: true })
	},
	(t) => [uniqueIndex('enrolments_user_course_idx').on(t.userId, t.courseId)]
);
export type Enrolment = typeof enrolments.$inferSelect;

export const paymentStatuses = ['pending', 'paid', 'refunded', 'cancelled'] as const;
export type PaymentStatus = (typeof paymentStatuses)[number];

export const payments = pgTable(
	'payments',
	{
		id: serial('id').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		courseId: integer('course_id')
			.notNull()
			.references(() => courses.id, { onDelete: 'cascade' }),
		checkoutSessionId: text('checkout_session_id').notNull().unique(),
		paymentIntentId: text('payment_intent_id'),
		amountCents: integer('amount_cents').notNull(),
		refundedCents: integer('refunded_cents').notNull().default(0),
		currency: text('currency').notNull(),
		couponCode: text('coupon_code'),
		status: text('status', { enum: paymentStatuses }).notNull().default('pending'),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		paidAt: timestamp('paid_at', { withTimezone: true }),
		refundedAt: timestamp('refunded_at', { withTimezone: true })
	},
	(t) => [index('payments_user_idx').on(t.userId), index('payments_intent_idx').on(t.paymentIntentId)]
);
export type Payment = typeof payments.$inferSelect;

/** Each webhook event once, by its id: replays find the row and change nothing. */
export const webhookEvents = pgTable('webhook_events', {
	id: text('id').primaryKey(),
	type: text('type').notNull(),
	payload: jsonb('payload').notNull(),
	receivedAt: timestamp('received_at', { withTimezone: true }).notNull().defaultNow(),
	processedAt: timestamp('processed_at', { withTimezone: true }),
	/** why a correctly signed event could not be used (acknowledged, so the provider stops retrying it) */
	rejectedReason: text('rejected_reason')
});
export type WebhookEvent = typeof webhookEvents.$inferSelect;

export const coupons = pgTable('coupons', {
	code: text('code').primaryKey(),
	percentOff: integer('percent_off').notNull(),
	active: boolean('active').notNull().default(true),
	/** null: no limit; counted over paid payments and free enrolments that used the code */
	maxUses: integer('max_uses'),
	/** null: never; from this moment the code is refused */
	expiresAt: timestamp('expires_at', { withTimezone: true }),
	note: text('note').notNull().default(''),
	createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
});
export type Coupon = typeof coupons.$inferSelect;
// ---- end enrolment ----

// ---- audit (issue 13): every consequential action, who, when, what and why ----

export const auditActions = [
	'role.change',
	'payment.refund',
	'enrolment.grant',
	'enrolment.revoke',
	'enrolment.restore',
	'verdict.override',
	'lesson.publish',
	'lesson.restore',
	'coupon.create',
	'coupon.change',
	'plan.approve',
	'plan.return',
	'credential.revoke',
	'credential.rules',
	'field-day.schedule',
	'field-day.change',
	'field-day.call-off',
	'cohort.create',
	'cohort.members',
	'cohort.due-dates'
] as const;
export type AuditAction = (typeof auditActions)[number];

/** One row per consequential action; the actor's e-mail is copied so the line survives a deleted account. */
export const auditLog = pgTable(
	'audit_log',
	{
		id: serial('id').primaryKey(),
		at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
		actorUserId: text('actor_user_id').references(() => users.id, { onDelete: 'set null' }),
		actorEmail: text('actor_email').notNull(),
		action: text('action', { enum: auditActions }).notNull(),
		/** what it was done to, in words: "lena@example.com in Daylight Flash for Action" */
		subject: text('subject').notNull(),
		/** what changed: "refunded 119.20 USD", "+mentor" */
		detail: text('detail').notNull().default(''),
		reason: text('reason').notNull().default(''),
		/** an in-app link to the thing, when there is a page for it */
		href: text('href')
	},
	(t) => [index('audit_log_at_idx').on(t.at), index('audit_log_action_idx').on(t.action, t.at)]
);
export type AuditEntry = typeof auditLog.$inferSelect;
// ---- end audit ----

/**
 * A frame on its way in through the resumable upload (tus): one row per frame of one submission, made when the upload
 * starts and deleted once its attempt is stored or the upload expires. The bytes live in the upload folder under `id`.
 */
export const frameUploads = pgTable(
	'frame_uploads',
	{
		/** the tus upload id (also the file's name in the upload folder) */
		id: text('id').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		assignmentId: integer('assignment_id')
			.notNull()
			.references(() => assignments.id, { onDelete: 'cascade' }),
		/** the key the attempt will carry: all frames of one submission share it */
		submissionKey: text('submission_key').notNull(),
		frameName: text('frame_name').notNull(),
		/** bytes declared when the upload started (Upload-Length) */
		size: integer('size').notNull(),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		/** when the last byte arrived; null while parts are still coming */
		finishedAt: timestamp('finished_at', { withTimezone: true })
	},
	(t) => [uniqueIndex('frame_uploads_frame_idx').on(t.userId, t.submissionKey, t.frameName), index('frame_uploads_created_idx').on(t.createdAt)]
);
export type FrameUpload = typeof frameUploads.$inferSelect;

// ---- learning records (xAPI) ----

export const learningRecordKinds = ['lesson-completed', 'quiz-answered', 'attempt-submitted', 'verdict-received', 'critique-received', 'course-completed'] as const;
export type LearningRecordKind = (typeof learningRecordKinds)[number];

/**
 * The outbox of xAPI statements: written in the transaction of the event they record, sent to the Learning Record Store
 * by the pg-boss job in `learning-records/`. The id is the statement's id, so a resend is the same statement.
 */
export const learningRecords = pgTable(
	'learning_records',
	{
		/** the statement id (a UUID, stable from the event where one event could be recorded twice) */
		id: text('id').primaryKey(),
		kind: text('kind', { enum: learningRecordKinds }).notNull(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		statement: jsonb('statement').$type<Record<string, unknown>>().notNull(),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		/** when the LRS took it (204, or 409: it already held that id); null while it waits */
		sentAt: timestamp('sent_at', { withTimezone: true }),
		tries: integer('tries').notNull().default(0),
		lastTriedAt: timestamp('last_tried_at', { withTimezone: true }),
		/** the last failure in one line (network, status and the LRS's message) */
		lastError: text('last_error'),
		/** the LRS's HTTP status at the last try */
		lrsStatus: integer('lrs_status'),
		/** the LRS refused it as malformed (a 4xx other than 401/403/408/409/429): not resent until an admin retries */
		rejected: boolean('rejected').notNull().default(false)
	},
	(t) => [index('learning_records_waiting_idx').on(t.createdAt).where(sql`${t.sentAt} is null`), index('learning_records_sent_idx').on(t.sentAt)]
);
export type LearningRecord = typeof learningRecords.$inferSelect;

// ---- lesson clips ----
/**
 * A short video placed in a lesson by `<Clip name="…" />`: its title and WebVTT captions, the resumable upload it came
 * in by, the transcoding's state and progress, and the web renditions stored under `clips/<id>/` in the file store.
 */
export const lessonClips = pgTable(
	'lesson_clips',
	{
		/** a random UUID made by the app (also the transcoding job's id) */
		id: text('id').primaryKey(),
		lessonId: integer('lesson_id')
			.notNull()
			.references(() => lessons.id, { onDelete: 'cascade' }),
		/** the name the widget tag uses; unique within its lesson */
		name: text('name').notNull(),
		title: text('title').notNull(),
		/** WebVTT text, checked when the clip is added */
		captions: text('captions').notNull(),
		status: text('status', { enum: ['uploading', 'queued', 'transcoding', 'ready', 'failed'] }).notNull().default('uploading'),
		/** 0–1 while transcoding, from ffmpeg's -progress */
		progress: real('progress').notNull().default(0),
		/** why transcoding failed, in the author's words */
		error: text('error'),
		/** the tus upload id while the source is on its way or waiting to be transcoded; null once it is used */
		uploadId: text('upload_id').unique(),
		uploadSize: integer('upload_size'),
		durationSeconds: real('duration_seconds'),
		renditions: jsonb('renditions').$type<ClipRendition[]>().notNull().default([]),
		/** the poster frame's file name under the clip's folder */
		poster: text('poster'),
		createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [uniqueIndex('lesson_clips_name_idx').on(t.lessonId, t.name)]
);
export type LessonClip = typeof lessonClips.$inferSelect;
// ---- end lesson clips ----

// ---- credentials (issue 16): the school's signing key, certificate rules, issued certificates ----

/** The school's Ed25519 signing keys as JWKs (RFC 7517); one is active. Made by the seed on first start. */
export const issuerKeys = pgTable(
	'issuer_keys',
	{
		/** the JWK thumbprint (RFC 7638), also the JWS header's `kid` */
		kid: text('kid').primaryKey(),
		publicJwk: jsonb('public_jwk').$type<Record<string, string>>().notNull(),
		privateJwk: jsonb('private_jwk').$type<Record<string, string>>().notNull(),
		active: boolean('active').notNull().default(true),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
	},
	// at most one active key: two first starts at once keep one of them
	(t) => [uniqueIndex('issuer_keys_one_active_idx').on(t.active).where(sql`${t.active}`)]
);
export type IssuerKey = typeof issuerKeys.$inferSelect;

/** What a course's certificate asks beyond every lesson: how many of its counted Assignments must be passed. */
export const credentialRules = pgTable('credential_rules', {
	courseId: integer('course_id')
		.primaryKey()
		.references(() => courses.id, { onDelete: 'cascade' }),
	/** null: every counted Assignment */
	minimumPassed: integer('minimum_passed'),
	updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
});
export type CredentialRule = typeof credentialRules.$inferSelect;

/** One certificate per learner and course: the signed credential (compact JWS) and its revocation, if any. */
export const issuedCredentials = pgTable(
	'issued_credentials',
	{
		/** a UUID; the credential's id is `urn:uuid:<id>` */
		id: text('id').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		courseId: integer('course_id')
			.notNull()
			.references(() => courses.id, { onDelete: 'cascade' }),
		kid: text('kid').notNull(),
		jwt: text('jwt').notNull(),
		issuedAt: timestamp('issued_at', { withTimezone: true }).notNull(),
		revokedAt: timestamp('revoked_at', { withTimezone: true }),
		revokedReason: text('revoked_reason').notNull().default('')
	},
	(t) => [uniqueIndex('issued_credentials_user_course_idx').on(t.userId, t.courseId), index('issued_credentials_issued_idx').on(t.issuedAt)]
);
export type IssuedCredential = typeof issuedCredentials.$inferSelect;
// ---- end credentials ----

// ---- field days ----

/** An in-person day at a venue: seats, a price or inclusion with enrolment, the kit list and the safety briefing. */
export const fieldDays = pgTable(
	'field_days',
	{
		id: serial('id').primaryKey(),
		slug: text('slug').notNull().unique(),
		courseId: integer('course_id')
			.notNull()
			.references(() => courses.id, { onDelete: 'cascade' }),
		/** the Assignment the day's frames are uploaded to (optional) */
		assignmentId: integer('assignment_id').references(() => assignments.id, { onDelete: 'set null' }),
		title: text('title').notNull(),
		summary: text('summary').notNull().default(''),
		startsAt: timestamp('starts_at', { withTimezone: true }).notNull(),
		endsAt: timestamp('ends_at', { withTimezone: true }).notNull(),
		/** IANA zone the times are shown in (the venue's) */
		timeZone: text('time_zone').notNull(),
		meetingPoint: text('meeting_point').notNull(),
		latitude: real('latitude'),
		longitude: real('longitude'),
		seats: integer('seats').notNull(),
		/** 0 with `includedWithEnrolment`: enrolled learners book without paying */
		priceCents: integer('price_cents').notNull().default(0),
		currency: text('currency').notNull().default('usd'),
		includedWithEnrolment: boolean('included_with_enrolment').notNull().default(false),
		/** a cancellation at least this many hours before the start is refunded in full; later, not at all */
		refundHours: integer('refund_hours').notNull().default(48),
		kitList: text('kit_list').notNull().default(''),
		safetyBriefing: text('safety_briefing').notNull(),
		mentorIds: text('mentor_ids').array().notNull().default(sql`'{}'::text[]`),
		status: text('status', { enum: ['scheduled', 'cancelled'] }).notNull().default('scheduled'),
		/** when and why it was called off, as every participant is told */
		calledOffAt: timestamp('called_off_at', { withTimezone: true }),
		callOffReason: text('call_off_reason'),
		createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('field_days_starts_idx').on(t.startsAt)]
);
export type FieldDay = typeof fieldDays.$inferSelect;

export const bookingStatuses = ['held', 'booked', 'waiting', 'offered', 'cancelled'] as const;
export type BookingStatus = (typeof bookingStatuses)[number];

/**
 * One row per learner and field day, changed in place: its id makes the calendar event's UID and `sequence` rises with
 * every change the learner is told of. `held` and `offered` keep a seat until `holdUntil`.
 */
export const fieldDayBookings = pgTable(
	'field_day_bookings',
	{
		id: serial('id').primaryKey(),
		fieldDayId: integer('field_day_id')
			.notNull()
			.references(() => fieldDays.id, { onDelete: 'cascade' }),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		status: text('status', { enum: bookingStatuses }).notNull(),
		/** checkout in progress (held) or a freed seat offered: the seat is kept until then */
		holdUntil: timestamp('hold_until', { withTimezone: true }),
		waitingSince: timestamp('waiting_since', { withTimezone: true }),
		checkoutSessionId: text('checkout_session_id').unique(),
		paymentIntentId: text('payment_intent_id'),
		amountCents: integer('amount_cents').notNull().default(0),
		refundedCents: integer('refunded_cents').notNull().default(0),
		briefingAcknowledgedAt: timestamp('briefing_acknowledged_at', { withTimezone: true }),
		/** the participant heard the briefing again at the venue and said so from their phone */
		briefingOnDayAt: timestamp('briefing_on_day_at', { withTimezone: true }),
		/** set by the mentor on duty at roll call */
		attendedAt: timestamp('attended_at', { withTimezone: true }),
		/** RFC 5545 SEQUENCE of this learner's event */
		sequence: integer('sequence').notNull().default(0),
		bookedAt: timestamp('booked_at', { withTimezone: true }),
		cancelledAt: timestamp('cancelled_at', { withTimezone: true }),
		createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
		updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [uniqueIndex('field_day_bookings_person_idx').on(t.fieldDayId, t.userId), index('field_day_bookings_status_idx').on(t.fieldDayId, t.status)]
);
export type FieldDayBooking = typeof fieldDayBookings.$inferSelect;

/** A learner's private calendar feed: the secret in its URL, kept so the page can show the address again; a reset replaces it. */
export const calendarFeeds = pgTable('calendar_feeds', {
	userId: text('user_id')
		.primaryKey()
		.references(() => users.id, { onDelete: 'cascade' }),
	token: text('token').notNull().unique(),
	createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
});
// ---- end field days ----

// ---- cohorts ----

/** Learners who start a course together, with a mentor and a due date per Assignment. */
export const cohorts = pgTable('cohorts', {
	id: serial('id').primaryKey(),
	slug: text('slug').notNull().unique(),
	title: text('title').notNull(),
	courseId: integer('course_id')
		.notNull()
		.references(() => courses.id, { onDelete: 'cascade' }),
	mentorId: text('mentor_id').references(() => users.id, { onDelete: 'set null' }),
	startsAt: timestamp('starts_at', { withTimezone: true }).notNull(),
	createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
});
export type Cohort = typeof cohorts.$inferSelect;

export const cohortMembers = pgTable(
	'cohort_members',
	{
		cohortId: integer('cohort_id')
			.notNull()
			.references(() => cohorts.id, { onDelete: 'cascade' }),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		joinedAt: timestamp('joined_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [primaryKey({ columns: [t.cohortId, t.userId] }), index('cohort_members_user_idx').on(t.userId)]
);

export const cohortDueDates = pgTable(
	'cohort_due_dates',
	{
		cohortId: integer('cohort_id')
			.notNull()
			.references(() => cohorts.id, { onDelete: 'cascade' }),
		assignmentId: integer('assignment_id')
			.notNull()
			.references(() => assignments.id, { onDelete: 'cascade' }),
		dueAt: timestamp('due_at', { withTimezone: true }).notNull(),
		/** when the reminder before this due date went out (once per cohort and Assignment) */
		remindedAt: timestamp('reminded_at', { withTimezone: true })
	},
	(t) => [primaryKey({ columns: [t.cohortId, t.assignmentId] }), index('cohort_due_dates_due_idx').on(t.dueAt)]
);
// ---- end cohorts ----

// ---- visitor page cache ----
/**
 * One row: the content epoch of the pages a visitor may be served from memory (src/lib/server/visitor-pages).
 * Triggers (migration visitor-page-epoch, written by hand: drizzle cannot express triggers) raise it once per
 * committing transaction that changes a table those pages read, so every app process sees a change on its next request.
 */
export const visitorPageEpoch = pgTable(
	'visitor_page_epoch',
	{
		id: integer('id').primaryKey().default(1),
		epoch: bigint('epoch', { mode: 'bigint' }).notNull().default(sql`0`)
	},
	(t) => [check('visitor_page_epoch_one_row', sql`${t.id} = 1`)]
);
// ---- end visitor page cache ----
