CREATE TABLE "kept_recipes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"still_id" uuid NOT NULL,
	"owner_id" uuid NOT NULL,
	"technique_id" uuid,
	"technique_title" text NOT NULL,
	"technique_slug" text NOT NULL,
	"revision_number" integer NOT NULL,
	"recipe" jsonb NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "plate_check_tries" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"still_id" uuid NOT NULL,
	"technique_id" uuid NOT NULL,
	"revision_number" integer NOT NULL,
	"detector_version" integer NOT NULL,
	"result" jsonb NOT NULL,
	"position" integer DEFAULT 0 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "plate_check_tries_still_technique" UNIQUE("still_id","technique_id")
);
--> statement-breakpoint
CREATE TABLE "plate_checks" (
	"still_id" uuid PRIMARY KEY NOT NULL,
	"detector_version" integer NOT NULL,
	"findings" jsonb NOT NULL,
	"checked_by_id" uuid,
	"checked_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "kept_recipes" ADD CONSTRAINT "kept_recipes_still_id_stills_id_fk" FOREIGN KEY ("still_id") REFERENCES "public"."stills"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "kept_recipes" ADD CONSTRAINT "kept_recipes_owner_id_users_id_fk" FOREIGN KEY ("owner_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "kept_recipes" ADD CONSTRAINT "kept_recipes_technique_id_techniques_id_fk" FOREIGN KEY ("technique_id") REFERENCES "public"."techniques"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plate_check_tries" ADD CONSTRAINT "plate_check_tries_still_id_stills_id_fk" FOREIGN KEY ("still_id") REFERENCES "public"."stills"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plate_check_tries" ADD CONSTRAINT "plate_check_tries_technique_id_techniques_id_fk" FOREIGN KEY ("technique_id") REFERENCES "public"."techniques"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plate_checks" ADD CONSTRAINT "plate_checks_still_id_stills_id_fk" FOREIGN KEY ("still_id") REFERENCES "public"."stills"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plate_checks" ADD CONSTRAINT "plate_checks_checked_by_id_users_id_fk" FOREIGN KEY ("checked_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "kept_recipes_still_owner" ON "kept_recipes" USING btree ("still_id","owner_id");