-- Authors follow their own techniques (issue 13): techniques written before this rule get the
-- subscription their author would have got at the first save, in the author's mail mode.
-- Someone already following keeps their row (and mode) as it is.
INSERT INTO "subscriptions" ("user_id", "kind", "key", "mode")
SELECT t."created_by_id", 'technique', t."slug", u."mail_mode"
FROM "techniques" t
JOIN "users" u ON u."id" = t."created_by_id"
ON CONFLICT ("user_id", "kind", "key") DO NOTHING;
