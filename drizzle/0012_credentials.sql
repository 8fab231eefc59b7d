CREATE TABLE "credential_rules" (
	"course_id" integer PRIMARY KEY NOT NULL,
	"minimum_passed" integer,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "issued_credentials" (
	"id" text PRIMARY KEY NOT NULL,
	"user_id" text NOT NULL,
	"course_id" integer NOT NULL,
	"kid" text NOT NULL,
	"jwt" text NOT NULL,
	"issued_at" timestamp with time zone NOT NULL,
	"revoked_at" timestamp with time zone,
	"revoked_reason" text DEFAULT '' NOT NULL
);
--> statement-breakpoint
CREATE TABLE "issuer_keys" (
	"kid" text PRIMARY KEY NOT NULL,
	"public_jwk" jsonb NOT NULL,
	"private_jwk" jsonb NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "assignments" ADD COLUMN "counts_for_credential" boolean DEFAULT true NOT NULL;--> statement-breakpoint
ALTER TABLE "credential_rules" ADD CONSTRAINT "credential_rules_course_id_courses_id_fk" FOREIGN KEY ("course_id") REFERENCES "public"."courses"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "issued_credentials" ADD CONSTRAINT "issued_credentials_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "issued_credentials" ADD CONSTRAINT "issued_credentials_course_id_courses_id_fk" FOREIGN KEY ("course_id") REFERENCES "public"."courses"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "issued_credentials_user_course_idx" ON "issued_credentials" USING btree ("user_id","course_id");--> statement-breakpoint
CREATE INDEX "issued_credentials_issued_idx" ON "issued_credentials" USING btree ("issued_at");--> statement-breakpoint
CREATE UNIQUE INDEX "issuer_keys_one_active_idx" ON "issuer_keys" USING btree ("active") WHERE "issuer_keys"."active";