ALTER TABLE "enrolments" ADD COLUMN "granted_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "webhook_events" ADD COLUMN "rejected_reason" text;