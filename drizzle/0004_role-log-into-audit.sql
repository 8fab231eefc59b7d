-- Custom SQL migration file, put your code below! --
-- The role log written before the audit log existed becomes its first entries.
INSERT INTO "audit_log" ("at", "actor_user_id", "actor_email", "action", "subject", "detail", "reason", "href")
SELECT "changed_at", "actor_user_id", "actor_email", 'role.change', "target_email",
	'roles ' || array_to_string("roles_before", ', ') || ' → ' || array_to_string("roles_after", ', '), '', NULL
FROM "role_audit"
ORDER BY "changed_at", "id";
