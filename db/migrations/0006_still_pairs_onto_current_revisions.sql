-- Before/after pairs made before they belonged to revisions (issue 13) keep working: each goes onto
-- the revision readers see (the approved one, else the newest), and every newer revision, which
-- showed the same pairs, gets a copy, so no revision diff reports them as changed.
UPDATE "still_pairs" p
SET "revision_id" = COALESCE(t."approved_revision_id", t."latest_revision_id")
FROM "techniques" t
WHERE t."id" = p."technique_id" AND p."revision_id" IS NULL;
--> statement-breakpoint
INSERT INTO "still_pairs" ("technique_id", "revision_id", "before_still_id", "after_still_id", "caption", "position", "created_at")
SELECT p."technique_id", newer."id", p."before_still_id", p."after_still_id", p."caption", p."position", p."created_at"
FROM "still_pairs" p
JOIN "revisions" current ON current."id" = p."revision_id"
JOIN "revisions" newer ON newer."technique_id" = current."technique_id" AND newer."number" > current."number";
--> statement-breakpoint
-- A technique without any revision cannot show a pair; none should exist, and the column becomes NOT NULL next.
DELETE FROM "still_pairs" WHERE "revision_id" IS NULL;
