-- The still page shows plate checks, tries and kept recipes: their changes raise the change stamp
-- like every other table a page shows (see 0001_change_stamp.sql).
CREATE TRIGGER "bump_change_stamp" AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON "plate_checks" FOR EACH STATEMENT EXECUTE FUNCTION "bump_change_stamp"();
--> statement-breakpoint
CREATE TRIGGER "bump_change_stamp" AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON "plate_check_tries" FOR EACH STATEMENT EXECUTE FUNCTION "bump_change_stamp"();
--> statement-breakpoint
CREATE TRIGGER "bump_change_stamp" AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON "kept_recipes" FOR EACH STATEMENT EXECUTE FUNCTION "bump_change_stamp"();
