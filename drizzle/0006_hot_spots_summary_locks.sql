-- The hot spots summary's locks, taken so that writers never wait on each other in a circle and a bulk
-- statement never runs out of lock slots:
--  * a pin takes its (unit, physical part, defect type) turn (the lock priorRepairs.lockKey takes) before
--    any summary row, as repairs and voids already do before they write, so a pin and a repair of the same
--    part cannot each hold what the other waits for;
--  * the months of a (unit type, part as named, unit) take turns by locking that row itself (a placeholder
--    is inserted first when there is none), in key order, instead of one advisory lock per key.
-- The (unit type, part as named, unit) keys whose set of months changes: the months gained, and whether one
-- may have been lost (then they are recounted from findings).
CREATE FUNCTION hot_spots_label_months(removed hot_spots_change[], added hot_spots_change[])
RETURNS TABLE (unit_type_key text, label text, unit_id uuid, gained date[], lost boolean)
LANGUAGE sql IMMUTABLE AS $$
  SELECT m.unit_type_key, m.label, m.unit_id, array_agg(m.month ORDER BY m.month) FILTER (WHERE m.n > 0), bool_or(m.n < 0)
    FROM (SELECT d.unit_type_key, d.label, d.unit_id, d.month, sum(d.s) AS n
            FROM hot_spots_signed(removed, added) d GROUP BY 1, 2, 3, 4 HAVING sum(d.s) <> 0) m
   GROUP BY 1, 2, 3
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION hot_spots_summary_apply(removed hot_spots_change[], added hot_spots_change[]) RETURNS void
LANGUAGE plpgsql AS $$
BEGIN
  IF coalesce(cardinality(removed), 0) + coalesce(cardinality(added), 0) = 0 THEN
    RETURN;
  END IF;

  -- The month sets first: a row for every key (ours, uncommitted, when new), then every key's row locked, in key order.
  INSERT INTO hot_spots_label_units (unit_type_key, label, unit_id, months)
  SELECT k.unit_type_key, k.label, k.unit_id, '{}' FROM hot_spots_label_months(removed, added) k ORDER BY 1, 2, 3
  ON CONFLICT DO NOTHING;
  PERFORM 1
     FROM hot_spots_label_units t JOIN hot_spots_label_months(removed, added) k
       ON k.unit_type_key = t.unit_type_key AND k.label = t.label AND k.unit_id = t.unit_id
    ORDER BY t.unit_type_key, t.label, t.unit_id
      FOR UPDATE OF t;

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

  -- Keys that only gained months: add them. Keys that may have lost one: their months again, from findings
  -- (this statement's snapshot is taken after the row locks above, so it sees every committed change to the key).
  UPDATE hot_spots_label_units t
     SET months = CASE WHEN k.lost
                       THEN ARRAY(SELECT DISTINCT date_trunc('month', f.created_at AT TIME ZONE s.time_zone)::date AS m
                                    FROM findings f, railroad_settings s
                                   WHERE s.id = 1 AND f.unit_id = k.unit_id AND f.unit_type_key = k.unit_type_key AND f.label = k.label
                                     AND f.state <> 'voided'
                                   ORDER BY 1)
                       ELSE ARRAY(SELECT DISTINCT x FROM unnest(t.months || k.gained) x ORDER BY x) END
    FROM hot_spots_label_months(removed, added) k
   WHERE k.unit_type_key = t.unit_type_key AND k.label = t.label AND k.unit_id = t.unit_id;
  DELETE FROM hot_spots_label_units t USING hot_spots_label_months(removed, added) k
   WHERE k.unit_type_key = t.unit_type_key AND k.label = t.label AND k.unit_id = t.unit_id AND cardinality(t.months) = 0;
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
  PERFORM hot_spots_summary_apply(removed, added);
  RETURN NULL;
END;
$$;
