CREATE TABLE "hot_spots_by_cell" (
	"unit_type_key" text NOT NULL,
	"month" date NOT NULL,
	"col" integer NOT NULL,
	"row" integer NOT NULL,
	"findings" integer NOT NULL,
	CONSTRAINT "hot_spots_by_cell_pk" PRIMARY KEY("unit_type_key","month","col","row")
);
--> statement-breakpoint
CREATE TABLE "hot_spots_by_label" (
	"unit_type_key" text NOT NULL,
	"month" date NOT NULL,
	"label" text NOT NULL,
	"part_kind" text NOT NULL,
	"part_label" text NOT NULL,
	"findings" integer NOT NULL,
	"repeats" integer NOT NULL,
	"sum_along" numeric NOT NULL,
	"sum_left" numeric NOT NULL,
	CONSTRAINT "hot_spots_by_label_pk" PRIMARY KEY("unit_type_key","month","label","part_kind","part_label")
);
--> statement-breakpoint
CREATE TABLE "hot_spots_by_unit" (
	"unit_type_key" text NOT NULL,
	"month" date NOT NULL,
	"unit_id" uuid NOT NULL,
	"findings" integer NOT NULL,
	"repeats" integer NOT NULL,
	CONSTRAINT "hot_spots_by_unit_pk" PRIMARY KEY("unit_type_key","month","unit_id")
);
--> statement-breakpoint
CREATE TABLE "hot_spots_label_units" (
	"unit_type_key" text NOT NULL,
	"label" text NOT NULL,
	"unit_id" uuid NOT NULL,
	"months" date[] NOT NULL,
	CONSTRAINT "hot_spots_label_units_pk" PRIMARY KEY("unit_type_key","label","unit_id")
);
--> statement-breakpoint
-- What one counted (non-voided) finding adds to the hot spots summary, under the railroad's zone and
-- repeat window and its unit type's half width. Cells are 12 in, the screen's grid (DEFAULT_CELL_IN).
CREATE TYPE "hot_spots_change" AS (
  unit_type_key text, month date, label text, part_kind text, part_label text, unit_id uuid,
  col integer, "row" integer, repeat boolean, along double precision, "left" double precision
);
--> statement-breakpoint
CREATE FUNCTION hot_spots_change_of(f findings, tz text, win integer, half double precision) RETURNS hot_spots_change
LANGUAGE sql STABLE AS $$
  SELECT ROW(f.unit_type_key, date_trunc('month', f.created_at AT TIME ZONE tz)::date, f.label, f.part_kind, f.part_label, f.unit_id,
             floor(f.front_along / 12::float8)::int, floor((f.front_left + half) / 12::float8)::int,
             coalesce(f.prior_repair_days <= win, false), f.front_along, f.front_left)::hot_spots_change
$$;
--> statement-breakpoint
CREATE FUNCTION hot_spots_signed(removed hot_spots_change[], added hot_spots_change[])
RETURNS TABLE (unit_type_key text, month date, label text, part_kind text, part_label text, unit_id uuid,
               col integer, "row" integer, repeat boolean, along double precision, "left" double precision, s integer)
LANGUAGE sql IMMUTABLE AS $$
  SELECT (c).*, -1 FROM unnest(removed) c
  UNION ALL
  SELECT (c).*, 1 FROM unnest(added) c
$$;
--> statement-breakpoint
-- Applies what a statement on findings removed and added. Counts and sums are added in key order
-- (row locks taken in one order); rows that fall to zero are dropped. The months of a (unit type,
-- part as named, unit) are a set, not a sum: a key that gains only months unions them in; a key
-- that may lose one is recounted from findings. Either takes turns per key (a transaction-scoped
-- lock taken before reading), so a recount sees every committed change to its key.
CREATE FUNCTION hot_spots_summary_apply(removed hot_spots_change[], added hot_spots_change[]) RETURNS void
LANGUAGE plpgsql AS $$
BEGIN
  IF coalesce(cardinality(removed), 0) + coalesce(cardinality(added), 0) = 0 THEN
    RETURN;
  END IF;

  PERFORM pg_advisory_xact_lock(4242007, k.h)
     FROM (SELECT DISTINCT hashtext(d.unit_type_key || '/' || d.label || '/' || d.unit_id::text) AS h
             FROM hot_spots_signed(removed, added) d
            GROUP BY d.unit_type_key, d.label, d.unit_id, d.month HAVING sum(d.s) <> 0
            ORDER BY 1) k;

  INSERT INTO hot_spots_by_label AS t (unit_type_key, month, label, part_kind, part_label, findings, repeats, sum_along, sum_left)
  SELECT d.unit_type_key, d.month, d.label, d.part_kind, d.part_label, sum(d.s)::int, coalesce(sum(d.s) FILTER (WHERE d.repeat), 0)::int,
         sum(d.s * d.along::numeric), sum(d.s * d."left"::numeric)
    FROM hot_spots_signed(removed, added) d
   GROUP BY 1, 2, 3, 4, 5
  HAVING sum(d.s) <> 0 OR coalesce(sum(d.s) FILTER (WHERE d.repeat), 0) <> 0 OR sum(d.s * d.along::numeric) <> 0 OR sum(d.s * d."left"::numeric) <> 0
   ORDER BY 1, 2, 3, 4, 5
  ON CONFLICT (unit_type_key, month, label, part_kind, part_label) DO UPDATE
     SET findings = t.findings + excluded.findings, repeats = t.repeats + excluded.repeats,
         sum_along = t.sum_along + excluded.sum_along, sum_left = t.sum_left + excluded.sum_left;

  INSERT INTO hot_spots_by_cell AS t (unit_type_key, month, col, "row", findings)
  SELECT d.unit_type_key, d.month, d.col, d."row", sum(d.s)::int
    FROM hot_spots_signed(removed, added) d
   GROUP BY 1, 2, 3, 4 HAVING sum(d.s) <> 0
   ORDER BY 1, 2, 3, 4
  ON CONFLICT (unit_type_key, month, col, "row") DO UPDATE SET findings = t.findings + excluded.findings;

  INSERT INTO hot_spots_by_unit AS t (unit_type_key, month, unit_id, findings, repeats)
  SELECT d.unit_type_key, d.month, d.unit_id, sum(d.s)::int, coalesce(sum(d.s) FILTER (WHERE d.repeat), 0)::int
    FROM hot_spots_signed(removed, added) d
   GROUP BY 1, 2, 3 HAVING sum(d.s) <> 0 OR coalesce(sum(d.s) FILTER (WHERE d.repeat), 0) <> 0
   ORDER BY 1, 2, 3
  ON CONFLICT (unit_type_key, month, unit_id) DO UPDATE SET findings = t.findings + excluded.findings, repeats = t.repeats + excluded.repeats;

  IF coalesce(cardinality(removed), 0) > 0 THEN
    DELETE FROM hot_spots_by_label t USING (SELECT DISTINCT c.unit_type_key, c.month, c.label, c.part_kind, c.part_label FROM unnest(removed) c) r
     WHERE t.unit_type_key = r.unit_type_key AND t.month = r.month AND t.label = r.label AND t.part_kind = r.part_kind
       AND t.part_label = r.part_label AND t.findings = 0;
    DELETE FROM hot_spots_by_cell t USING (SELECT DISTINCT c.unit_type_key, c.month, c.col, c."row" FROM unnest(removed) c) r
     WHERE t.unit_type_key = r.unit_type_key AND t.month = r.month AND t.col = r.col AND t."row" = r."row" AND t.findings = 0;
    DELETE FROM hot_spots_by_unit t USING (SELECT DISTINCT c.unit_type_key, c.month, c.unit_id FROM unnest(removed) c) r
     WHERE t.unit_type_key = r.unit_type_key AND t.month = r.month AND t.unit_id = r.unit_id AND t.findings = 0;
  END IF;

  -- Keys that only gained months.
  INSERT INTO hot_spots_label_units AS t (unit_type_key, label, unit_id, months)
  SELECT m.unit_type_key, m.label, m.unit_id, array_agg(m.month ORDER BY m.month)
    FROM (SELECT d.unit_type_key, d.label, d.unit_id, d.month, sum(d.s) AS n
            FROM hot_spots_signed(removed, added) d GROUP BY 1, 2, 3, 4 HAVING sum(d.s) <> 0) m
   GROUP BY 1, 2, 3 HAVING bool_and(m.n > 0)
   ORDER BY 1, 2, 3
  ON CONFLICT (unit_type_key, label, unit_id) DO UPDATE
     SET months = ARRAY(SELECT DISTINCT x FROM unnest(t.months || excluded.months) x ORDER BY x);

  -- Keys that may have lost a month: their months again, from findings.
  WITH k AS (
    SELECT m.unit_type_key, m.label, m.unit_id
      FROM (SELECT d.unit_type_key, d.label, d.unit_id, d.month, sum(d.s) AS n
              FROM hot_spots_signed(removed, added) d GROUP BY 1, 2, 3, 4 HAVING sum(d.s) <> 0) m
     GROUP BY 1, 2, 3 HAVING NOT bool_and(m.n > 0)
  ), fresh AS (
    SELECT k.unit_type_key, k.label, k.unit_id,
           ARRAY(SELECT DISTINCT date_trunc('month', f.created_at AT TIME ZONE s.time_zone)::date AS m
                   FROM findings f, railroad_settings s
                  WHERE s.id = 1 AND f.unit_id = k.unit_id AND f.unit_type_key = k.unit_type_key AND f.label = k.label AND f.state <> 'voided'
                  ORDER BY 1) AS months
      FROM k
  ), gone AS (
    DELETE FROM hot_spots_label_units t USING fresh
     WHERE cardinality(fresh.months) = 0 AND t.unit_type_key = fresh.unit_type_key AND t.label = fresh.label AND t.unit_id = fresh.unit_id
  )
  INSERT INTO hot_spots_label_units AS t (unit_type_key, label, unit_id, months)
  SELECT unit_type_key, label, unit_id, months FROM fresh WHERE cardinality(months) > 0
   ORDER BY 1, 2, 3
  ON CONFLICT (unit_type_key, label, unit_id) DO UPDATE SET months = excluded.months;
END;
$$;
--> statement-breakpoint
-- The trigger on findings: what the statement's rows counted before and count now.
CREATE FUNCTION hot_spots_findings_changed() RETURNS trigger
LANGUAGE plpgsql AS $$
DECLARE
  removed hot_spots_change[];
  added hot_spots_change[];
BEGIN
  IF TG_OP = 'INSERT' THEN
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
  PERFORM hot_spots_summary_apply(removed, added);
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER findings_hot_spots_insert AFTER INSERT ON findings REFERENCING NEW TABLE AS new_rows
  FOR EACH STATEMENT EXECUTE FUNCTION hot_spots_findings_changed();
--> statement-breakpoint
CREATE TRIGGER findings_hot_spots_update AFTER UPDATE ON findings REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows
  FOR EACH STATEMENT EXECUTE FUNCTION hot_spots_findings_changed();
--> statement-breakpoint
CREATE TRIGGER findings_hot_spots_delete AFTER DELETE ON findings REFERENCING OLD TABLE AS old_rows
  FOR EACH STATEMENT EXECUTE FUNCTION hot_spots_findings_changed();
--> statement-breakpoint
-- The whole summary from findings, in one pass (migration backfill, bulk loads with triggers off,
-- and a change of zone or of a unit type's width).
CREATE FUNCTION hot_spots_summary_rebuild() RETURNS void
LANGUAGE plpgsql AS $$
BEGIN
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
-- A new repeat window: only findings whose day count lies between the old and the new window change side.
CREATE FUNCTION hot_spots_summary_rewindow(old_win integer, new_win integer) RETURNS void
LANGUAGE plpgsql AS $$
BEGIN
  WITH d AS (
    SELECT f.unit_type_key, date_trunc('month', f.created_at AT TIME ZONE s.time_zone)::date AS month, f.label, f.part_kind, f.part_label, f.unit_id
      FROM findings f, railroad_settings s
     WHERE s.id = 1 AND f.state <> 'voided'
       AND f.prior_repair_days > least(old_win, new_win) AND f.prior_repair_days <= greatest(old_win, new_win)
  ), l AS (
    UPDATE hot_spots_by_label t SET repeats = t.repeats + x.n
      FROM (SELECT unit_type_key, month, label, part_kind, part_label, count(*)::int * sign(new_win - old_win)::int AS n FROM d GROUP BY 1, 2, 3, 4, 5) x
     WHERE t.unit_type_key = x.unit_type_key AND t.month = x.month AND t.label = x.label AND t.part_kind = x.part_kind AND t.part_label = x.part_label
  )
  UPDATE hot_spots_by_unit t SET repeats = t.repeats + x.n
    FROM (SELECT unit_type_key, month, unit_id, count(*)::int * sign(new_win - old_win)::int AS n FROM d GROUP BY 1, 2, 3) x
   WHERE t.unit_type_key = x.unit_type_key AND t.month = x.month AND t.unit_id = x.unit_id;
END;
$$;
--> statement-breakpoint
CREATE FUNCTION hot_spots_settings_changed() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'UPDATE' AND OLD.time_zone = NEW.time_zone THEN
    PERFORM hot_spots_summary_rewindow(OLD.repeat_window_days, NEW.repeat_window_days);
  ELSE
    PERFORM hot_spots_summary_rebuild();
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER railroad_settings_hot_spots_set AFTER INSERT OR DELETE ON railroad_settings
  FOR EACH ROW EXECUTE FUNCTION hot_spots_settings_changed();
--> statement-breakpoint
CREATE TRIGGER railroad_settings_hot_spots_change AFTER UPDATE ON railroad_settings FOR EACH ROW
  WHEN (OLD.time_zone IS DISTINCT FROM NEW.time_zone OR OLD.repeat_window_days IS DISTINCT FROM NEW.repeat_window_days)
  EXECUTE FUNCTION hot_spots_settings_changed();
--> statement-breakpoint
CREATE FUNCTION hot_spots_rebuild_trigger() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  PERFORM hot_spots_summary_rebuild();
  RETURN NULL;
END;
$$;
--> statement-breakpoint
-- Cells are placed by the unit type's half width.
CREATE TRIGGER unit_types_hot_spots AFTER UPDATE ON unit_types FOR EACH ROW
  WHEN (OLD.width_in IS DISTINCT FROM NEW.width_in) EXECUTE FUNCTION hot_spots_rebuild_trigger();
--> statement-breakpoint
CREATE FUNCTION hot_spots_findings_truncated() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  DELETE FROM hot_spots_by_label;
  DELETE FROM hot_spots_by_cell;
  DELETE FROM hot_spots_by_unit;
  DELETE FROM hot_spots_label_units;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER findings_hot_spots_truncate AFTER TRUNCATE ON findings FOR EACH STATEMENT EXECUTE FUNCTION hot_spots_findings_truncated();
--> statement-breakpoint
-- Backfill.
SELECT hot_spots_summary_rebuild();
