ALTER TABLE "still_pairs" ADD COLUMN "revision_id" uuid;--> statement-breakpoint
ALTER TABLE "still_pairs" ADD CONSTRAINT "still_pairs_revision_id_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "still_pairs_revision" ON "still_pairs" USING btree ("revision_id");