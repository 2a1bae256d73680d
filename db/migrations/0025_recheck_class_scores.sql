-- The scorecards' mean IoU per class sums plain columns (bench/scorecards-api.ts): per submitted
-- recheck and defect class, the unit-level IoU, Dice and union of its stored comparison
-- (lib/recheck/compare.ts `classes`), written by a trigger in the transaction that stores the
-- comparison (the app's submission, the demo seed and the bench alike), and backfilled below.
CREATE TABLE "recheck_class_scores" (
	"workspace_id" uuid NOT NULL,
	"recheck_id" uuid NOT NULL,
	"defect" text NOT NULL,
	"first_grader_id" uuid NOT NULL,
	"first_graded_at" timestamp with time zone NOT NULL,
	"not_blind" boolean NOT NULL,
	"union_px" double precision NOT NULL,
	"iou" double precision NOT NULL,
	"dice" double precision NOT NULL,
	CONSTRAINT "recheck_class_scores_pkey" PRIMARY KEY("recheck_id","defect"),
	CONSTRAINT "recheck_class_scores_iou" CHECK ("recheck_class_scores"."iou" >= 0 AND "recheck_class_scores"."iou" <= 1 AND "recheck_class_scores"."dice" >= 0 AND "recheck_class_scores"."dice" <= 1 AND "recheck_class_scores"."union_px" >= 0)
);
--> statement-breakpoint
ALTER TABLE "recheck_class_scores" ADD CONSTRAINT "recheck_class_scores_workspace_id_workspaces_id_fk" FOREIGN KEY ("workspace_id") REFERENCES "public"."workspaces"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recheck_class_scores" ADD CONSTRAINT "recheck_class_scores_recheck_fk" FOREIGN KEY ("workspace_id","recheck_id") REFERENCES "public"."rechecks"("workspace_id","id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "recheck_class_scores_scorecard_idx" ON "recheck_class_scores" USING btree ("workspace_id","first_graded_at","first_grader_id","defect","iou","union_px","not_blind");
--> statement-breakpoint
-- The class rows of one comparison. Classes without a numeric IoU or union are left out (the
-- scorecards never counted them). Dice where a stored comparison lacks it: 2J / (1 + J), the same
-- pooled pixel counts' Dice (compare.ts computes both from one intersection and union).
CREATE FUNCTION recheck_class_rows(comparison jsonb)
RETURNS TABLE (defect text, union_px double precision, iou double precision, dice double precision)
LANGUAGE sql IMMUTABLE AS $$
  SELECT c.key, (c.value->>'unionPx')::float8, (c.value->>'iou')::float8,
         coalesce((c.value->>'dice')::float8, 2 * (c.value->>'iou')::float8 / (1 + (c.value->>'iou')::float8))
  FROM jsonb_each(coalesce(comparison->'classes', '{}'::jsonb)) c
  WHERE jsonb_typeof(c.value->'iou') = 'number' AND jsonb_typeof(c.value->'unionPx') = 'number'
$$;
--> statement-breakpoint
CREATE FUNCTION write_recheck_class_scores() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  DELETE FROM recheck_class_scores WHERE recheck_id = NEW.id;
  IF NEW.submitted_at IS NOT NULL AND NEW.comparison IS NOT NULL THEN
    INSERT INTO recheck_class_scores (workspace_id, recheck_id, defect, first_grader_id, first_graded_at, not_blind, union_px, iou, dice)
    SELECT NEW.workspace_id, NEW.id, c.defect, NEW.first_grader_id, NEW.first_graded_at, NEW.not_blind, c.union_px, c.iou, c.dice
    FROM recheck_class_rows(NEW.comparison) c;
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER rechecks_class_scores_insert
  AFTER INSERT ON rechecks
  FOR EACH ROW WHEN (NEW.submitted_at IS NOT NULL AND NEW.comparison IS NOT NULL) EXECUTE FUNCTION write_recheck_class_scores();
--> statement-breakpoint
CREATE TRIGGER rechecks_class_scores_update
  AFTER UPDATE OF comparison, submitted_at, not_blind, first_grader_id, first_graded_at ON rechecks
  FOR EACH ROW WHEN (
    OLD.comparison IS DISTINCT FROM NEW.comparison OR (OLD.submitted_at IS NULL) <> (NEW.submitted_at IS NULL) OR OLD.not_blind <> NEW.not_blind
    OR OLD.first_grader_id <> NEW.first_grader_id OR OLD.first_graded_at <> NEW.first_graded_at
  ) EXECUTE FUNCTION write_recheck_class_scores();
--> statement-breakpoint
INSERT INTO recheck_class_scores (workspace_id, recheck_id, defect, first_grader_id, first_graded_at, not_blind, union_px, iou, dice)
SELECT r.workspace_id, r.id, c.defect, r.first_grader_id, r.first_graded_at, r.not_blind, c.union_px, c.iou, c.dice
FROM rechecks r CROSS JOIN LATERAL recheck_class_rows(r.comparison) c
WHERE r.submitted_at IS NOT NULL AND r.comparison IS NOT NULL;
