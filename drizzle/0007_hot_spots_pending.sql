CREATE TABLE "hot_spots_pending" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"removed" "hot_spots_change"[],
	"added" "hot_spots_change"[]
);
--> statement-breakpoint
-- Folds what single writes left in hot_spots_pending into the summary: one folder at a time (a
-- transaction-scoped lock), taking only the rows committed when it starts; later ones wait for the next.
CREATE FUNCTION hot_spots_fold() RETURNS void
LANGUAGE plpgsql AS $$
DECLARE
  removed hot_spots_change[];
  added hot_spots_change[];
BEGIN
  PERFORM pg_advisory_xact_lock(4242007);
  WITH moved AS (DELETE FROM hot_spots_pending RETURNING hot_spots_pending.removed, hot_spots_pending.added)
  SELECT ARRAY(SELECT c FROM moved m, unnest(m.removed) c), ARRAY(SELECT c FROM moved m, unnest(m.added) c) INTO removed, added;
  PERFORM hot_spots_summary_apply(removed, added);
END;
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION hot_spots_findings_changed() RETURNS trigger
LANGUAGE plpgsql AS $$
DECLARE
  removed hot_spots_change[];
  added hot_spots_change[];
BEGIN
  IF TG_OP = 'INSERT' THEN
    -- A pin's turn on its part (bulk loads, which no repair runs beside, skip it: one lock per key would not fit).
    IF (SELECT count(*) FROM new_rows) <= 64 THEN
      PERFORM pg_advisory_xact_lock(4242006, k.h)
         FROM (SELECT DISTINCT hashtext(n.unit_id::text || '/' || n.instance_id || '/' || n.defect_type) AS h FROM new_rows n ORDER BY 1) k;
    END IF;
    added := ARRAY(SELECT hot_spots_change_of(n, s.time_zone, s.repeat_window_days, t.width_in / 2)
                     FROM new_rows n JOIN unit_types t ON t.key = n.unit_type_key, railroad_settings s
                    WHERE s.id = 1 AND n.state <> 'voided');
  ELSIF TG_OP = 'DELETE' THEN
    removed := ARRAY(SELECT hot_spots_change_of(o, s.time_zone, s.repeat_window_days, t.width_in / 2)
                       FROM old_rows o JOIN unit_types t ON t.key = o.unit_type_key, railroad_settings s
                      WHERE s.id = 1 AND o.state <> 'voided');
  ELSE
    SELECT array_agg(p.a) FILTER (WHERE p.a_counts), array_agg(p.b) FILTER (WHERE p.b_counts) INTO removed, added
      FROM (SELECT o.state <> 'voided' AS a_counts, hot_spots_change_of(o, s.time_zone, s.repeat_window_days, ot.width_in / 2) AS a,
                   n.state <> 'voided' AS b_counts, hot_spots_change_of(n, s.time_zone, s.repeat_window_days, nt.width_in / 2) AS b
              FROM old_rows o JOIN new_rows n ON n.id = o.id
              JOIN unit_types ot ON ot.key = o.unit_type_key JOIN unit_types nt ON nt.key = n.unit_type_key, railroad_settings s
             WHERE s.id = 1) p
     WHERE (p.a_counts, p.a) IS DISTINCT FROM (p.b_counts, p.b) AND (p.a_counts OR p.b_counts);
  END IF;
  IF coalesce(cardinality(removed), 0) + coalesce(cardinality(added), 0) = 0 THEN
    RETURN NULL;
  END IF;
  -- A single write appends its changes for the next fold; a bulk statement (a recount, a backfill) applies
  -- its own at once, as one fold would.
  IF coalesce(cardinality(removed), 0) + coalesce(cardinality(added), 0) <= 64 THEN
    INSERT INTO hot_spots_pending (removed, added) VALUES (removed, added);
  ELSE
    PERFORM hot_spots_summary_apply(removed, added);
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION hot_spots_summary_rebuild() RETURNS void
LANGUAGE plpgsql AS $$
BEGIN
  -- What is waiting is in findings already (committed with it) or not yet visible (folded later).
  PERFORM pg_advisory_xact_lock(4242007);
  DELETE FROM hot_spots_pending;
  DELETE FROM hot_spots_by_label;
  DELETE FROM hot_spots_by_cell;
  DELETE FROM hot_spots_by_unit;
  DELETE FROM hot_spots_label_units;
  WITH g AS MATERIALIZED (
    SELECT grouping(c.label, c.part_kind, c.part_label, c.col, c."row", c.unit_id) AS gs, c.unit_type_key, c.month, c.label, c.part_kind, c.part_label,
           c.col, c."row", c.unit_id, count(*)::int AS n, (count(*) FILTER (WHERE c.repeat))::int AS r,
           sum(c.along::numeric) AS sa, sum(c."left"::numeric) AS sl
      FROM (SELECT (hot_spots_change_of(f, s.time_zone, s.repeat_window_days, t.width_in / 2)).*
              FROM findings f JOIN unit_types t ON t.key = f.unit_type_key, railroad_settings s
             WHERE s.id = 1 AND f.state <> 'voided') c
     GROUP BY GROUPING SETS ((c.unit_type_key, c.month, c.label, c.part_kind, c.part_label),
                             (c.unit_type_key, c.month, c.col, c."row"),
                             (c.unit_type_key, c.month, c.unit_id),
                             (c.unit_type_key, c.month, c.label, c.unit_id))
  ), a AS (
    INSERT INTO hot_spots_by_label (unit_type_key, month, label, part_kind, part_label, findings, repeats, sum_along, sum_left)
    SELECT unit_type_key, month, label, part_kind, part_label, n, r, sa, sl FROM g WHERE gs = 7
  ), b AS (
    INSERT INTO hot_spots_by_cell (unit_type_key, month, col, "row", findings)
    SELECT unit_type_key, month, col, "row", n FROM g WHERE gs = 57
  ), u AS (
    INSERT INTO hot_spots_by_unit (unit_type_key, month, unit_id, findings, repeats)
    SELECT unit_type_key, month, unit_id, n, r FROM g WHERE gs = 62
  )
  INSERT INTO hot_spots_label_units (unit_type_key, label, unit_id, months)
  SELECT unit_type_key, label, unit_id, array_agg(month ORDER BY month) FROM g WHERE gs = 30 GROUP BY 1, 2, 3;
END;
$$;
--> statement-breakpoint
-- A new repeat window is applied to the summary as it stands: what is waiting is folded first.
CREATE OR REPLACE FUNCTION hot_spots_settings_changed() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'UPDATE' AND OLD.time_zone = NEW.time_zone THEN
    PERFORM hot_spots_fold();
    PERFORM hot_spots_summary_rewindow(OLD.repeat_window_days, NEW.repeat_window_days);
  ELSE
    PERFORM hot_spots_summary_rebuild();
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION hot_spots_findings_truncated() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  DELETE FROM hot_spots_pending;
  DELETE FROM hot_spots_by_label;
  DELETE FROM hot_spots_by_cell;
  DELETE FROM hot_spots_by_unit;
  DELETE FROM hot_spots_label_units;
  RETURN NULL;
END;
$$;
