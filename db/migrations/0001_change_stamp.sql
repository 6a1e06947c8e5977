CREATE TABLE "change_stamp" (
	"id" integer PRIMARY KEY NOT NULL,
	"value" bigint DEFAULT 0 NOT NULL
);
--> statement-breakpoint
INSERT INTO "change_stamp" ("id", "value") VALUES (1, 0);
--> statement-breakpoint
-- Statement-level, so a bulk import bumps the stamp once; it commits with the change it marks.
-- The notice lets a process that holds the database in memory (PGlite) drop what it remembered
-- about sessions and pages before the writer gets its answer (db/change-watch.ts).
CREATE FUNCTION "bump_change_stamp"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  UPDATE "change_stamp" SET "value" = "value" + 1 WHERE "id" = 1;
  PERFORM pg_notify('plateroom_changes', '');
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE FUNCTION "notify_change"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  PERFORM pg_notify('plateroom_changes', '');
  RETURN NULL;
END;
$$;
--> statement-breakpoint
-- Every table whose rows a page can show. Not mail, tokens, sign-in failures or the audit log:
-- pages never show them, and some change on every scripted request.
DO $$
DECLARE t text;
BEGIN
  FOREACH t IN ARRAY ARRAY['users', 'shows', 'shots', 'uses', 'stills', 'still_pairs', 'tags', 'techniques',
    'technique_slug_history', 'revisions', 'house_methods', 'questions', 'answers', 'technique_requests', 'subscriptions']
  LOOP
    EXECUTE format('CREATE TRIGGER "bump_change_stamp" AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON %I FOR EACH STATEMENT EXECUTE FUNCTION "bump_change_stamp"()', t);
  END LOOP;
END;
$$;
--> statement-breakpoint
-- API tokens are not shown on pages, but revoking one must end remembered sessions at once.
CREATE TRIGGER "notify_change" AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON "api_tokens" FOR EACH STATEMENT EXECUTE FUNCTION "notify_change"();
