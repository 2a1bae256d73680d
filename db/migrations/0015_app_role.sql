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
