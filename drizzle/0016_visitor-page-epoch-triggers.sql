-- The content epoch of the visitor page cache (src/lib/server/visitor-pages): the one row, and triggers that raise it
-- once per committing transaction that changes a table the cached pages read (their queries: lessons/page-query.ts,
-- courses.ts, instructors.ts). Row triggers are deferred to commit, so the row is locked only while
-- a transaction commits (writers do not queue behind each other's open transactions, and cannot deadlock on it);
-- TRUNCATE, which has no row trigger, raises it at once. Written by hand: drizzle-kit cannot express triggers.
INSERT INTO "visitor_page_epoch" ("id", "epoch") VALUES (1, 0) ON CONFLICT ("id") DO NOTHING;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION "bump_visitor_page_epoch"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	-- once per transaction: the new value becomes visible together with the transaction's changes
	IF current_setting('stopwise.visitor_page_epoch_bumped', true) IS DISTINCT FROM 'yes' THEN
		PERFORM set_config('stopwise.visitor_page_epoch_bumped', 'yes', true);
		UPDATE "visitor_page_epoch" SET "epoch" = "epoch" + 1 WHERE "id" = 1;
	END IF;
	RETURN NULL;
END
$$;
--> statement-breakpoint
CREATE CONSTRAINT TRIGGER "courses_bump_visitor_page_epoch" AFTER INSERT OR UPDATE OR DELETE ON "courses" DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION "bump_visitor_page_epoch"();
--> statement-breakpoint
CREATE TRIGGER "courses_truncate_bumps_visitor_page_epoch" AFTER TRUNCATE ON "courses" FOR EACH STATEMENT EXECUTE FUNCTION "bump_visitor_page_epoch"();
--> statement-breakpoint
CREATE CONSTRAINT TRIGGER "modules_bump_visitor_page_epoch" AFTER INSERT OR UPDATE OR DELETE ON "modules" DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION "bump_visitor_page_epoch"();
--> statement-breakpoint
CREATE TRIGGER "modules_truncate_bumps_visitor_page_epoch" AFTER TRUNCATE ON "modules" FOR EACH STATEMENT EXECUTE FUNCTION "bump_visitor_page_epoch"();
--> statement-breakpoint
CREATE CONSTRAINT TRIGGER "lessons_bump_visitor_page_epoch" AFTER INSERT OR UPDATE OR DELETE ON "lessons" DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION "bump_visitor_page_epoch"();
--> statement-breakpoint
CREATE TRIGGER "lessons_truncate_bumps_visitor_page_epoch" AFTER TRUNCATE ON "lessons" FOR EACH STATEMENT EXECUTE FUNCTION "bump_visitor_page_epoch"();
--> statement-breakpoint
CREATE CONSTRAINT TRIGGER "assignments_bump_visitor_page_epoch" AFTER INSERT OR UPDATE OR DELETE ON "assignments" DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION "bump_visitor_page_epoch"();
--> statement-breakpoint
CREATE TRIGGER "assignments_truncate_bumps_visitor_page_epoch" AFTER TRUNCATE ON "assignments" FOR EACH STATEMENT EXECUTE FUNCTION "bump_visitor_page_epoch"();
--> statement-breakpoint
CREATE CONSTRAINT TRIGGER "lesson_clips_bump_visitor_page_epoch" AFTER INSERT OR UPDATE OR DELETE ON "lesson_clips" DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION "bump_visitor_page_epoch"();
--> statement-breakpoint
CREATE TRIGGER "lesson_clips_truncate_bumps_visitor_page_epoch" AFTER TRUNCATE ON "lesson_clips" FOR EACH STATEMENT EXECUTE FUNCTION "bump_visitor_page_epoch"();
