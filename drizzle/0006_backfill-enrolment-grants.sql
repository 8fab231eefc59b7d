-- Access opened by an admin or for free was a grant all along: mark it so refunds of other payments leave it open.
UPDATE "enrolments" SET "granted_at" = "created_at" WHERE "source" IN ('admin', 'free') AND "status" = 'active';
