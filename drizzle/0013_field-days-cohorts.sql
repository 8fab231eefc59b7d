CREATE TABLE "calendar_feeds" (
	"user_id" text PRIMARY KEY NOT NULL,
	"token" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "calendar_feeds_token_unique" UNIQUE("token")
);
--> statement-breakpoint
CREATE TABLE "cohort_due_dates" (
	"cohort_id" integer NOT NULL,
	"assignment_id" integer NOT NULL,
	"due_at" timestamp with time zone NOT NULL,
	"reminded_at" timestamp with time zone,
	CONSTRAINT "cohort_due_dates_cohort_id_assignment_id_pk" PRIMARY KEY("cohort_id","assignment_id")
);
--> statement-breakpoint
CREATE TABLE "cohort_members" (
	"cohort_id" integer NOT NULL,
	"user_id" text NOT NULL,
	"joined_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "cohort_members_cohort_id_user_id_pk" PRIMARY KEY("cohort_id","user_id")
);
--> statement-breakpoint
CREATE TABLE "cohorts" (
	"id" serial PRIMARY KEY NOT NULL,
	"slug" text NOT NULL,
	"title" text NOT NULL,
	"course_id" integer NOT NULL,
	"mentor_id" text,
	"starts_at" timestamp with time zone NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "cohorts_slug_unique" UNIQUE("slug")
);
--> statement-breakpoint
CREATE TABLE "field_day_bookings" (
	"id" serial PRIMARY KEY NOT NULL,
	"field_day_id" integer NOT NULL,
	"user_id" text NOT NULL,
	"status" text NOT NULL,
	"hold_until" timestamp with time zone,
	"waiting_since" timestamp with time zone,
	"checkout_session_id" text,
	"payment_intent_id" text,
	"amount_cents" integer DEFAULT 0 NOT NULL,
	"refunded_cents" integer DEFAULT 0 NOT NULL,
	"briefing_acknowledged_at" timestamp with time zone,
	"briefing_on_day_at" timestamp with time zone,
	"attended_at" timestamp with time zone,
	"sequence" integer DEFAULT 0 NOT NULL,
	"booked_at" timestamp with time zone,
	"cancelled_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "field_day_bookings_checkout_session_id_unique" UNIQUE("checkout_session_id")
);
--> statement-breakpoint
CREATE TABLE "field_days" (
	"id" serial PRIMARY KEY NOT NULL,
	"slug" text NOT NULL,
	"course_id" integer NOT NULL,
	"assignment_id" integer,
	"title" text NOT NULL,
	"summary" text DEFAULT '' NOT NULL,
	"starts_at" timestamp with time zone NOT NULL,
	"ends_at" timestamp with time zone NOT NULL,
	"time_zone" text NOT NULL,
	"meeting_point" text NOT NULL,
	"latitude" real,
	"longitude" real,
	"seats" integer NOT NULL,
	"price_cents" integer DEFAULT 0 NOT NULL,
	"currency" text DEFAULT 'usd' NOT NULL,
	"included_with_enrolment" boolean DEFAULT false NOT NULL,
	"refund_hours" integer DEFAULT 48 NOT NULL,
	"kit_list" text DEFAULT '' NOT NULL,
	"safety_briefing" text NOT NULL,
	"mentor_ids" text[] DEFAULT '{}'::text[] NOT NULL,
	"status" text DEFAULT 'scheduled' NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "field_days_slug_unique" UNIQUE("slug")
);
--> statement-breakpoint
ALTER TABLE "calendar_feeds" ADD CONSTRAINT "calendar_feeds_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cohort_due_dates" ADD CONSTRAINT "cohort_due_dates_cohort_id_cohorts_id_fk" FOREIGN KEY ("cohort_id") REFERENCES "public"."cohorts"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cohort_due_dates" ADD CONSTRAINT "cohort_due_dates_assignment_id_assignments_id_fk" FOREIGN KEY ("assignment_id") REFERENCES "public"."assignments"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cohort_members" ADD CONSTRAINT "cohort_members_cohort_id_cohorts_id_fk" FOREIGN KEY ("cohort_id") REFERENCES "public"."cohorts"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cohort_members" ADD CONSTRAINT "cohort_members_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cohorts" ADD CONSTRAINT "cohorts_course_id_courses_id_fk" FOREIGN KEY ("course_id") REFERENCES "public"."courses"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "cohorts" ADD CONSTRAINT "cohorts_mentor_id_users_id_fk" FOREIGN KEY ("mentor_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "field_day_bookings" ADD CONSTRAINT "field_day_bookings_field_day_id_field_days_id_fk" FOREIGN KEY ("field_day_id") REFERENCES "public"."field_days"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "field_day_bookings" ADD CONSTRAINT "field_day_bookings_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "field_days" ADD CONSTRAINT "field_days_course_id_courses_id_fk" FOREIGN KEY ("course_id") REFERENCES "public"."courses"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "field_days" ADD CONSTRAINT "field_days_assignment_id_assignments_id_fk" FOREIGN KEY ("assignment_id") REFERENCES "public"."assignments"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "field_days" ADD CONSTRAINT "field_days_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "cohort_due_dates_due_idx" ON "cohort_due_dates" USING btree ("due_at");--> statement-breakpoint
CREATE INDEX "cohort_members_user_idx" ON "cohort_members" USING btree ("user_id");--> statement-breakpoint
CREATE UNIQUE INDEX "field_day_bookings_person_idx" ON "field_day_bookings" USING btree ("field_day_id","user_id");--> statement-breakpoint
CREATE INDEX "field_day_bookings_status_idx" ON "field_day_bookings" USING btree ("field_day_id","status");--> statement-breakpoint
CREATE INDEX "field_days_starts_idx" ON "field_days" USING btree ("starts_at");