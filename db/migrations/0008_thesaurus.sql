CREATE TYPE "public"."thesaurus_kind" AS ENUM('synonyms', 'narrower');--> statement-breakpoint
CREATE TABLE "thesaurus_entries" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"kind" "thesaurus_kind" NOT NULL,
	"broader" text,
	"terms" text[] DEFAULT '{}'::text[] NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_by_id" uuid
);
--> statement-breakpoint
ALTER TABLE "thesaurus_entries" ADD CONSTRAINT "thesaurus_entries_updated_by_id_users_id_fk" FOREIGN KEY ("updated_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;