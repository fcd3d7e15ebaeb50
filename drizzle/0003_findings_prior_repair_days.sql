ALTER TABLE "findings" ADD COLUMN "prior_repair_days" integer;--> statement-breakpoint
-- Backfill: the days (railroad zone) from the latest repair of a non-voided finding of the same unit,
-- physical part and defect type, repaired no later than each finding was found (the repeat rule's one
-- number), in one pass; the same statement as REFRESH_ALL_PRIOR_REPAIR_DAYS in server/modules/hot-spots.
UPDATE "findings" f
   SET "prior_repair_days" = (f."created_at" AT TIME ZONE z.tz)::date - (w.last_repair AT TIME ZONE z.tz)::date
  FROM (SELECT id, kind, max(repaired_at) OVER (PARTITION BY unit_id, instance_id, defect_type ORDER BY at, kind ROWS UNBOUNDED PRECEDING) AS last_repair
          FROM (SELECT id, unit_id, instance_id, defect_type, repaired_at AS at, 0 AS kind, repaired_at
                  FROM "findings" WHERE repaired_at IS NOT NULL AND state <> 'voided'
                UNION ALL
                SELECT id, unit_id, instance_id, defect_type, created_at, 1, NULL FROM "findings") e) w,
       (SELECT time_zone AS tz FROM "railroad_settings" WHERE id = 1) z
 WHERE w.kind = 1 AND w.id = f.id
   AND f."prior_repair_days" IS DISTINCT FROM (f."created_at" AT TIME ZONE z.tz)::date - (w.last_repair AT TIME ZONE z.tz)::date;--> statement-breakpoint
CREATE INDEX "findings_hot_spots_cover" ON "findings" USING btree ("unit_type_key","created_at","state","part_kind","label","part_label","unit_id","defect_type","weight","inspection_id","front_along","front_left","prior_repair_days");
