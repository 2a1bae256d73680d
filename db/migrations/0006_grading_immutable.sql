-- A published rubric version is the rule a grade was given by: once published it never changes.
-- Drafts (OLD.status = 'draft') may be edited, published or discarded.
CREATE FUNCTION refuse_published_rubric_change() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF OLD.status = 'published' THEN
    RAISE EXCEPTION 'rubric_versions: version % is published and immutable (% refused)', OLD.version, TG_OP USING ERRCODE = 'insufficient_privilege';
  END IF;
  IF TG_OP = 'DELETE' THEN
    RETURN OLD;
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER rubric_versions_published_immutable
  BEFORE UPDATE OR DELETE ON rubric_versions
  FOR EACH ROW EXECUTE FUNCTION refuse_published_rubric_change();
--> statement-breakpoint
-- Grades are a history: rows may be added, never changed or removed.
CREATE FUNCTION refuse_grade_change() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'grades is append-only (% refused)', TG_OP USING ERRCODE = 'insufficient_privilege';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER grades_append_only
  BEFORE UPDATE OR DELETE ON grades
  FOR EACH ROW EXECUTE FUNCTION refuse_grade_change();
--> statement-breakpoint
CREATE TRIGGER grades_no_truncate
  BEFORE TRUNCATE ON grades
  FOR EACH STATEMENT EXECUTE FUNCTION refuse_grade_change();
--> statement-breakpoint
CREATE FUNCTION refuse_rubric_truncate() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'rubric_versions holds published versions and cannot be truncated' USING ERRCODE = 'insufficient_privilege';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER rubric_versions_no_truncate
  BEFORE TRUNCATE ON rubric_versions
  FOR EACH STATEMENT EXECUTE FUNCTION refuse_rubric_truncate();
