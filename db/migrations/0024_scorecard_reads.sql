-- Scorecards read fast by design (bench/scorecards-api.ts): the first grade's facts live on the
-- recheck row, and inspection grades are counted per grader and local day as they are recorded,
-- so a period's scorecards read a few thousand small rows instead of every grade of the period.
CREATE TABLE "grader_day_counts" (
	"workspace_id" uuid NOT NULL,
	"grader_id" uuid NOT NULL,
	"day" date NOT NULL,
	"graded" integer NOT NULL,
	CONSTRAINT "grader_day_counts_pkey" PRIMARY KEY("workspace_id","day","grader_id"),
	CONSTRAINT "grader_day_counts_graded" CHECK ("grader_day_counts"."graded" > 0)
);
--> statement-breakpoint
ALTER TABLE "grader_day_counts" ADD CONSTRAINT "grader_day_counts_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "grader_day_counts" ADD CONSTRAINT "grader_day_counts_grader_fk" FOREIGN KEY ("workspace_id","grader_id") REFERENCES "public"."users"("workspace_id","id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
-- Existing rechecks take their grade's facts (grades are append-only: the copies never go stale).
ALTER TABLE "rechecks" ADD COLUMN "first_grade" text;--> statement-breakpoint
ALTER TABLE "rechecks" ADD COLUMN "first_graded_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "rechecks" ADD COLUMN "adjudicated_grade" text;--> statement-breakpoint
UPDATE "rechecks" r SET "first_grade" = g."final_grade", "first_graded_at" = g."created_at" FROM "grades" g WHERE g."id" = r."grade_id";--> statement-breakpoint
UPDATE "rechecks" r SET "adjudicated_grade" = a."final_grade" FROM "grades" a WHERE a."id" = r."adjudication_grade_id";--> statement-breakpoint
ALTER TABLE "rechecks" ALTER COLUMN "first_grade" SET NOT NULL;--> statement-breakpoint
ALTER TABLE "rechecks" ALTER COLUMN "first_graded_at" SET NOT NULL;--> statement-breakpoint
ALTER TABLE "rechecks" ADD CONSTRAINT "rechecks_adjudicated_grade" CHECK (("rechecks"."adjudication_grade_id" IS NULL) = ("rechecks"."adjudicated_grade" IS NULL));--> statement-breakpoint
CREATE INDEX "rechecks_scorecard_idx" ON "rechecks" USING btree ("workspace_id","first_graded_at") WHERE "rechecks"."submitted_at" IS NOT NULL;--> statement-breakpoint
-- Each inspection grade adds one to its grader's local day, in the grade's own transaction.
CREATE FUNCTION count_inspection_grade() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  INSERT INTO grader_day_counts (workspace_id, grader_id, day, graded)
  SELECT NEW.workspace_id, NEW.graded_by, (NEW.created_at AT TIME ZONE w.time_zone)::date, 1
  FROM workspaces w WHERE w.id = NEW.workspace_id
  ON CONFLICT (workspace_id, day, grader_id) DO UPDATE SET graded = grader_day_counts.graded + 1;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER grades_count_inspection
  AFTER INSERT ON grades
  FOR EACH ROW WHEN (NEW.kind = 'inspection') EXECUTE FUNCTION count_inspection_grade();
--> statement-breakpoint
-- Local days move with the workspace's time zone: recount that workspace's days from its grades.
CREATE FUNCTION recount_grader_days() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  DELETE FROM grader_day_counts WHERE workspace_id = NEW.id;
  INSERT INTO grader_day_counts (workspace_id, grader_id, day, graded)
  SELECT workspace_id, graded_by, (created_at AT TIME ZONE NEW.time_zone)::date, count(*)
  FROM grades WHERE workspace_id = NEW.id AND kind = 'inspection'
  GROUP BY 1, 2, 3;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER workspaces_recount_grader_days
  AFTER UPDATE OF time_zone ON workspaces
  FOR EACH ROW WHEN (OLD.time_zone IS DISTINCT FROM NEW.time_zone) EXECUTE FUNCTION recount_grader_days();
--> statement-breakpoint
INSERT INTO grader_day_counts (workspace_id, grader_id, day, graded)
SELECT g.workspace_id, g.graded_by, (g.created_at AT TIME ZONE w.time_zone)::date, count(*)
FROM grades g JOIN workspaces w ON w.id = g.workspace_id
WHERE g.kind = 'inspection'
GROUP BY 1, 2, 3;
