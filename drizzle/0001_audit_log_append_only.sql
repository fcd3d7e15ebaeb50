-- The audit log and signed inspection records are append-only: no UPDATE or DELETE, whoever asks.
CREATE OR REPLACE FUNCTION hoodline_refuse_change() RETURNS trigger AS $$
BEGIN
  RAISE EXCEPTION 'audit_log is append-only' USING ERRCODE = 'insufficient_privilege';
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER audit_log_no_update BEFORE UPDATE OR DELETE ON audit_log FOR EACH ROW EXECUTE FUNCTION hoodline_refuse_change();
--> statement-breakpoint
CREATE OR REPLACE FUNCTION hoodline_signed_inspection_frozen() RETURNS trigger AS $$
BEGIN
  IF OLD.status = 'signed' THEN
    RAISE EXCEPTION 'signed inspection % is never changed', OLD.id USING ERRCODE = 'insufficient_privilege';
  END IF;
  IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
  RETURN NEW;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER inspections_signed_frozen BEFORE UPDATE OR DELETE ON inspections FOR EACH ROW EXECUTE FUNCTION hoodline_signed_inspection_frozen();
