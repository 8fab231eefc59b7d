ALTER TABLE "field_days" ADD COLUMN "called_off_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "field_days" ADD COLUMN "call_off_reason" text;