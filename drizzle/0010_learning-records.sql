CREATE TABLE "learning_records" (
	"id" text PRIMARY KEY NOT NULL,
	"kind" text NOT NULL,
	"user_id" text NOT NULL,
	"statement" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"sent_at" timestamp with time zone,
	"tries" integer DEFAULT 0 NOT NULL,
	"last_tried_at" timestamp with time zone,
	"last_error" text,
	"lrs_status" integer,
	"rejected" boolean DEFAULT false NOT NULL
);
--> statement-breakpoint
ALTER TABLE "learning_records" ADD CONSTRAINT "learning_records_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "learning_records_waiting_idx" ON "learning_records" USING btree ("created_at") WHERE "learning_records"."sent_at" is null;--> statement-breakpoint
CREATE INDEX "learning_records_sent_idx" ON "learning_records" USING btree ("sent_at");