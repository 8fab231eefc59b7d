CREATE TABLE "lesson_clips" (
	"id" text PRIMARY KEY NOT NULL,
	"lesson_id" integer NOT NULL,
	"name" text NOT NULL,
	"title" text NOT NULL,
	"captions" text NOT NULL,
	"status" text DEFAULT 'uploading' NOT NULL,
	"progress" real DEFAULT 0 NOT NULL,
	"error" text,
	"upload_id" text,
	"upload_size" integer,
	"duration_seconds" real,
	"renditions" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"poster" text,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "lesson_clips_upload_id_unique" UNIQUE("upload_id")
);
--> statement-breakpoint
ALTER TABLE "lesson_clips" ADD CONSTRAINT "lesson_clips_lesson_id_lessons_id_fk" FOREIGN KEY ("lesson_id") REFERENCES "public"."lessons"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lesson_clips" ADD CONSTRAINT "lesson_clips_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "lesson_clips_name_idx" ON "lesson_clips" USING btree ("lesson_id","name");