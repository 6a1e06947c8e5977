-- Several app instances on one PostgreSQL server each keep an in-memory search index. These
-- triggers say which technique's search document a committed change touched, on the channel
-- the change watch already listens to (0001), so every instance updates within a second
-- (lib/techniques/search-follow.ts). PostgreSQL delivers a notice only after its transaction
-- commits, and drops duplicates within one transaction. Payload: 'search:<technique id>', or
-- 'search:*' when every document may have changed (a tag renamed, a shot code changed).
CREATE FUNCTION "notify_search_change"() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  column_name text := TG_ARGV[0];
  new_id text;
  old_id text;
BEGIN
  IF TG_OP <> 'DELETE' THEN new_id := to_jsonb(NEW) ->> column_name; END IF;
  IF TG_OP <> 'INSERT' THEN old_id := to_jsonb(OLD) ->> column_name; END IF;
  IF new_id IS NOT NULL THEN PERFORM pg_notify('plateroom_changes', 'search:' || new_id); END IF;
  IF old_id IS NOT NULL AND old_id IS DISTINCT FROM new_id THEN PERFORM pg_notify('plateroom_changes', 'search:' || old_id); END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE FUNCTION "notify_search_reload"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  PERFORM pg_notify('plateroom_changes', 'search:*');
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER "notify_search_change" AFTER INSERT OR UPDATE OR DELETE ON "techniques" FOR EACH ROW EXECUTE FUNCTION "notify_search_change"('id');
--> statement-breakpoint
CREATE TRIGGER "notify_search_change" AFTER INSERT OR UPDATE OR DELETE ON "revisions" FOR EACH ROW EXECUTE FUNCTION "notify_search_change"('technique_id');
--> statement-breakpoint
CREATE TRIGGER "notify_search_change" AFTER INSERT OR UPDATE OR DELETE ON "uses" FOR EACH ROW EXECUTE FUNCTION "notify_search_change"('technique_id');
--> statement-breakpoint
CREATE TRIGGER "notify_search_change" AFTER INSERT OR UPDATE OR DELETE ON "house_methods" FOR EACH ROW EXECUTE FUNCTION "notify_search_change"('technique_id');
--> statement-breakpoint
CREATE TRIGGER "notify_search_reload" AFTER UPDATE OR DELETE OR TRUNCATE ON "tags" FOR EACH STATEMENT EXECUTE FUNCTION "notify_search_reload"();
--> statement-breakpoint
CREATE TRIGGER "notify_search_reload" AFTER UPDATE OF "code" ON "shots" FOR EACH STATEMENT EXECUTE FUNCTION "notify_search_reload"();
