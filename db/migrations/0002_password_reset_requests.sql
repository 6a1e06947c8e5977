CREATE TABLE "password_reset_requests" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"email" text NOT NULL,
	"address" text NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE INDEX "password_reset_requests_email_at" ON "password_reset_requests" USING btree ("email","at");--> statement-breakpoint
CREATE INDEX "password_reset_requests_address_at" ON "password_reset_requests" USING btree ("address","at");