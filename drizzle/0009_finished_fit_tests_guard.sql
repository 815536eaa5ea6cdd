-- A finished fit-test revision is a record (29 CFR 1910.134(m)(2)); it is never edited. The app
-- corrects it with a new revision, then marks it superseded, or withdraws it with a reason. This
-- trigger refuses every other change, and deleting it, whoever asks, so a connection that goes
-- around the app cannot rewrite a result. SQLSTATE SW001 is ours; the API answers it with 409.
CREATE OR REPLACE FUNCTION fit_tests_guard_finished() RETURNS trigger AS $$
DECLARE
  mutable text[] := ARRAY['status', 'withdrawn_reason', 'version', 'updated_at'];
BEGIN
  IF TG_OP = 'DELETE' THEN
    IF OLD.status <> 'draft' THEN
      RAISE EXCEPTION 'fit_tests: a % revision cannot be deleted', OLD.status USING ERRCODE = 'SW001';
    END IF;
    RETURN OLD;
  END IF;
  IF OLD.status = 'draft' THEN
    RETURN NEW;
  END IF;
  IF NOT (NEW.status = OLD.status OR (OLD.status = 'finished' AND NEW.status IN ('superseded', 'withdrawn'))) THEN
    RAISE EXCEPTION 'fit_tests: a % revision cannot become %', OLD.status, NEW.status USING ERRCODE = 'SW001';
  END IF;
  IF NEW.withdrawn_reason IS DISTINCT FROM OLD.withdrawn_reason AND NEW.status <> 'withdrawn' THEN
    RAISE EXCEPTION 'fit_tests: a withdrawal reason belongs to a withdrawal' USING ERRCODE = 'SW001';
  END IF;
  IF (to_jsonb(NEW) - mutable) IS DISTINCT FROM (to_jsonb(OLD) - mutable) THEN
    RAISE EXCEPTION 'fit_tests: a % revision is never edited; correct it with a new revision', OLD.status USING ERRCODE = 'SW001';
  END IF;
  RETURN NEW;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER fit_tests_guard_finished
  BEFORE UPDATE OR DELETE ON fit_tests
  FOR EACH ROW EXECUTE FUNCTION fit_tests_guard_finished();
