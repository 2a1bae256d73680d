CREATE TABLE "rate_limit_counters" (
	"bucket" text NOT NULL,
	"key" text NOT NULL,
	"window_start" timestamp with time zone NOT NULL,
	"count" integer NOT NULL,
	CONSTRAINT "rate_limit_counters_bucket_key_pk" PRIMARY KEY("bucket","key")
);
--> statement-breakpoint
CREATE TABLE "revoked_sessions" (
	"session_id" uuid PRIMARY KEY NOT NULL,
	"user_id" uuid NOT NULL,
	"expires_at" timestamp with time zone NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sign_up_requests" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"email" text NOT NULL,
	"company_name" text NOT NULL,
	"name" text NOT NULL,
	"token_hash" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"used_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "sign_up_requests_tokenHash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
ALTER TABLE "sign_in_failures" DISABLE ROW LEVEL SECURITY;--> statement-breakpoint
DROP TABLE "sign_in_failures" CASCADE;--> statement-breakpoint
DROP INDEX "users_email_key";--> statement-breakpoint
ALTER TABLE "outgoing_emails" ALTER COLUMN "workspace_id" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "outgoing_emails" ADD COLUMN "attempts" integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "outgoing_emails" ADD COLUMN "updated_at" timestamp with time zone DEFAULT now() NOT NULL;--> statement-breakpoint
ALTER TABLE "revoked_sessions" ADD CONSTRAINT "revoked_sessions_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "rate_limit_counters_window_idx" ON "rate_limit_counters" USING btree ("window_start");--> statement-breakpoint
-- Only the newest unused link per user and purpose stays live (what issueAuthToken always meant).
UPDATE "auth_tokens" t SET "used_at" = now() WHERE t."used_at" IS NULL AND EXISTS (SELECT 1 FROM "auth_tokens" n WHERE n."user_id" = t."user_id" AND n."purpose" = t."purpose" AND n."used_at" IS NULL AND (n."created_at", n."id") > (t."created_at", t."id"));--> statement-breakpoint
CREATE UNIQUE INDEX "auth_tokens_live_key" ON "auth_tokens" USING btree ("user_id","purpose") WHERE "auth_tokens"."used_at" IS NULL;--> statement-breakpoint
CREATE UNIQUE INDEX "users_workspace_email_key" ON "users" USING btree ("workspace_id","email");--> statement-breakpoint
CREATE UNIQUE INDEX "users_email_key" ON "users" USING btree ("email") WHERE "users"."password_hash" IS NOT NULL;