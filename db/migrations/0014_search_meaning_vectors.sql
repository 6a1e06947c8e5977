CREATE TABLE "search_meaning_vectors" (
	"key" text PRIMARY KEY NOT NULL,
	"vector" "bytea" NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
