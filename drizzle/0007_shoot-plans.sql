CREATE TABLE "shoot_plans" (
	"id" serial PRIMARY KEY NOT NULL,
	"user_id" text NOT NULL,
	"assignment_id" integer NOT NULL,
	"light_plan" jsonb NOT NULL,
	"settings" jsonb NOT NULL,
	"story" text NOT NULL,
	"checklist" jsonb NOT NULL,
	"status" text DEFAULT 'waiting' NOT NULL,
	"mentor_id" text,
	"mentor_note" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"decided_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "shoot_plans" ADD CONSTRAINT "shoot_plans_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shoot_plans" ADD CONSTRAINT "shoot_plans_assignment_id_assignments_id_fk" FOREIGN KEY ("assignment_id") REFERENCES "public"."assignments"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shoot_plans" ADD CONSTRAINT "shoot_plans_mentor_id_users_id_fk" FOREIGN KEY ("mentor_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "shoot_plans_user_assignment_idx" ON "shoot_plans" USING btree ("user_id","assignment_id","created_at");--> statement-breakpoint
CREATE INDEX "shoot_plans_status_idx" ON "shoot_plans" USING btree ("status","created_at");