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
	"starter_part_types" text[] DEFAULT '{}'::text[] NOT NULL,
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
CREATE UNIQUE INDEX "users_email_key" ON "users" USING btree ("email") WHERE "users"."password_hash" IS NOT NULL;--> statement-breakpoint
-- The role the app connects as (README, "Database roles"). It reads and writes company data but
-- owns none of it, so it cannot disable the triggers that keep the evidence append-only, alter or
-- drop tables, or change grants; on the append-only tables it may only add and read rows.
-- Migrations run as the tables' owner. pg-boss's schema belongs to the app role, since pg-boss
-- creates and attaches a table per queue while it runs.
DO $$
BEGIN
  IF NOT EXISTS (SELECT FROM pg_roles WHERE rolname = 'partproof_app') THEN
    CREATE ROLE partproof_app NOLOGIN;
  END IF;
END $$;
--> statement-breakpoint
GRANT USAGE ON SCHEMA public TO partproof_app;
--> statement-breakpoint
-- pg-boss runs `CREATE SCHEMA IF NOT EXISTS pgboss` at every start, which needs the right to create schemas.
DO $$
BEGIN
  EXECUTE format('GRANT CREATE ON DATABASE %I TO partproof_app', current_database());
END $$;
--> statement-breakpoint
GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA public TO partproof_app;
--> statement-breakpoint
GRANT USAGE, SELECT ON ALL SEQUENCES IN SCHEMA public TO partproof_app;
--> statement-breakpoint
ALTER DEFAULT PRIVILEGES IN SCHEMA public GRANT SELECT, INSERT, UPDATE, DELETE ON TABLES TO partproof_app;
--> statement-breakpoint
ALTER DEFAULT PRIVILEGES IN SCHEMA public GRANT USAGE, SELECT ON SEQUENCES TO partproof_app;
--> statement-breakpoint
REVOKE UPDATE, DELETE, TRUNCATE ON activity_log, grades FROM partproof_app;
--> statement-breakpoint
DO $$
DECLARE r record;
BEGIN
  IF NOT EXISTS (SELECT FROM pg_namespace WHERE nspname = 'pgboss') THEN
    EXECUTE 'CREATE SCHEMA pgboss AUTHORIZATION partproof_app';
    RETURN;
  END IF;
  -- A database where pg-boss already ran as the owner: hand its schema over.
  EXECUTE 'ALTER SCHEMA pgboss OWNER TO partproof_app';
  FOR r IN
    SELECT c.relname, c.relkind FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
    WHERE n.nspname = 'pgboss' AND c.relkind IN ('r', 'p', 'v', 'S')
      -- A sequence that belongs to a column changes owner with its table.
      AND NOT (c.relkind = 'S' AND EXISTS (SELECT 1 FROM pg_depend d WHERE d.classid = 'pg_class'::regclass AND d.objid = c.oid AND d.deptype IN ('a', 'i')))
  LOOP
    EXECUTE format('ALTER %s pgboss.%I OWNER TO partproof_app', CASE r.relkind WHEN 'S' THEN 'SEQUENCE' WHEN 'v' THEN 'VIEW' ELSE 'TABLE' END, r.relname);
  END LOOP;
  FOR r IN SELECT t.typname FROM pg_type t JOIN pg_namespace n ON n.oid = t.typnamespace WHERE n.nspname = 'pgboss' AND t.typtype = 'e' LOOP
    EXECUTE format('ALTER TYPE pgboss.%I OWNER TO partproof_app', r.typname);
  END LOOP;
  FOR r IN SELECT p.oid::regprocedure AS signature FROM pg_proc p JOIN pg_namespace n ON n.oid = p.pronamespace WHERE n.nspname = 'pgboss' LOOP
    EXECUTE format('ALTER FUNCTION %s OWNER TO partproof_app', r.signature);
  END LOOP;
END $$;
