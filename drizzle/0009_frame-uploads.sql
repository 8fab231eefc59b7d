CREATE TABLE "frame_uploads" (
	"id" text PRIMARY KEY NOT NULL,
	"user_id" text NOT NULL,
	"assignment_id" integer NOT NULL,
	"submission_key" text NOT NULL,
	"frame_name" text NOT NULL,
	"size" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"finished_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "frame_uploads" ADD CONSTRAINT "frame_uploads_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "frame_uploads" ADD CONSTRAINT "frame_uploads_assignment_id_assignments_id_fk" FOREIGN KEY ("assignment_id") REFERENCES "public"."assignments"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "frame_uploads_frame_idx" ON "frame_uploads" USING btree ("user_id","submission_key","frame_name");--> statement-breakpoint
CREATE INDEX "frame_uploads_created_idx" ON "frame_uploads" USING btree ("created_at");