CREATE TABLE "audit_log" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	"actor_id" uuid,
	"action" text NOT NULL,
	"entity" text NOT NULL,
	"entity_id" text,
	"ip" text,
	"details" jsonb
);
--> statement-breakpoint
CREATE TABLE "finding_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"finding_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"from_state" text,
	"to_state" text,
	"actor_id" uuid NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	"details" jsonb,
	CONSTRAINT "finding_events_kind" CHECK (kind in ('created', 'assigned', 'repair_started', 'repaired', 'verified', 'sent_back', 'voided', 'noted'))
);
--> statement-breakpoint
CREATE TABLE "findings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"inspection_id" uuid NOT NULL,
	"unit_id" uuid NOT NULL,
	"unit_type_key" text NOT NULL,
	"part_id" text NOT NULL,
	"instance_id" text NOT NULL,
	"part_kind" text NOT NULL,
	"view" text NOT NULL,
	"body_x" double precision NOT NULL,
	"body_y" double precision NOT NULL,
	"body_z" double precision NOT NULL,
	"front_along" double precision NOT NULL,
	"front_left" double precision NOT NULL,
	"front_end" text NOT NULL,
	"label" text NOT NULL,
	"part_label" text NOT NULL,
	"side" text NOT NULL,
	"end_role" text,
	"number" smallint,
	"defect_type" text NOT NULL,
	"weight" text NOT NULL,
	"rule" text,
	"measurement_value" double precision,
	"measurement_unit" text,
	"measurement_in" double precision,
	"check_result" jsonb,
	"note" text,
	"state" text DEFAULT 'open' NOT NULL,
	"assigned_to" uuid,
	"created_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"repaired_at" timestamp with time zone,
	"void_reason" text,
	"version" integer DEFAULT 1 NOT NULL,
	"idempotency_key" text,
	CONSTRAINT "findings_state" CHECK (state in ('open', 'in_repair', 'repaired', 'verified', 'voided')),
	CONSTRAINT "findings_weight" CHECK (weight in ('federal', 'shop', 'note')),
	CONSTRAINT "findings_front_end" CHECK (front_end in ('short_hood', 'long_hood')),
	CONSTRAINT "findings_side" CHECK (side in ('left', 'right', 'center')),
	CONSTRAINT "findings_unit" CHECK ("findings"."measurement_unit" is null or "findings"."measurement_unit" in ('in', 'mm')),
	CONSTRAINT "findings_voided_reason" CHECK ("findings"."state" <> 'voided' or "findings"."void_reason" is not null)
);
--> statement-breakpoint
CREATE TABLE "idempotency_keys" (
	"person_id" uuid NOT NULL,
	"key" text NOT NULL,
	"method" text NOT NULL,
	"path" text NOT NULL,
	"status" integer NOT NULL,
	"response" jsonb,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "idempotency_keys_person_id_key_pk" PRIMARY KEY("person_id","key")
);
--> statement-breakpoint
CREATE TABLE "inspection_items" (
	"inspection_id" uuid NOT NULL,
	"instance_id" text NOT NULL,
	"state" text NOT NULL,
	"reason" text,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "inspection_items_inspection_id_instance_id_pk" PRIMARY KEY("inspection_id","instance_id"),
	CONSTRAINT "inspection_items_state" CHECK (state in ('passed', 'finding', 'not_applicable', 'gap'))
);
--> statement-breakpoint
CREATE TABLE "inspections" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"unit_id" uuid NOT NULL,
	"inspector_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"status" text DEFAULT 'in_progress' NOT NULL,
	"front_end_seen" text NOT NULL,
	"front_end_recorded" text NOT NULL,
	"yard_id" uuid,
	"routine_id" uuid,
	"routine_snapshot" jsonb,
	"started_at" timestamp with time zone DEFAULT now() NOT NULL,
	"signed_at" timestamp with time zone,
	"corrects_id" uuid,
	"correction_note" text,
	"version" integer DEFAULT 1 NOT NULL,
	"idempotency_key" text,
	CONSTRAINT "inspections_kind" CHECK (kind in ('daily', 'periodic')),
	CONSTRAINT "inspections_status" CHECK (status in ('in_progress', 'signed')),
	CONSTRAINT "inspections_front_seen" CHECK (front_end_seen in ('short_hood', 'long_hood')),
	CONSTRAINT "inspections_front_recorded" CHECK (front_end_recorded in ('short_hood', 'long_hood')),
	CONSTRAINT "inspections_signed_has_time" CHECK (("inspections"."status" = 'signed') = ("inspections"."signed_at" is not null))
);
--> statement-breakpoint
CREATE TABLE "notifications_outbox" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"kind" text NOT NULL,
	"to_address" text NOT NULL,
	"subject" text NOT NULL,
	"body" text NOT NULL,
	"status" text DEFAULT 'pending' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"next_attempt_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_error" text,
	"dedupe_key" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"sent_at" timestamp with time zone,
	CONSTRAINT "outbox_status" CHECK (status in ('pending', 'sent', 'failed'))
);
--> statement-breakpoint
CREATE TABLE "people" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"email" text NOT NULL,
	"name" text NOT NULL,
	"role" text NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"password_hash" text NOT NULL,
	"yard_id" uuid,
	"failed_logins" integer DEFAULT 0 NOT NULL,
	"locked_until" timestamp with time zone,
	"sessions_valid_after" timestamp with time zone,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "people_role" CHECK (role in ('inspector', 'foreman', 'engineer', 'trainer', 'admin'))
);
--> statement-breakpoint
CREATE TABLE "photos" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"finding_id" uuid,
	"finding_event_id" uuid,
	"storage_key" text NOT NULL,
	"thumb_key" text,
	"content_type" text NOT NULL,
	"size_bytes" integer NOT NULL,
	"width" integer,
	"height" integer,
	"created_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "photos_storage_key_unique" UNIQUE("storage_key"),
	CONSTRAINT "photos_type" CHECK (content_type in ('image/jpeg', 'image/png', 'image/webp'))
);
--> statement-breakpoint
CREATE TABLE "railroad_settings" (
	"id" smallint PRIMARY KEY DEFAULT 1 NOT NULL,
	"name" text NOT NULL,
	"reporting_mark" varchar(4) NOT NULL,
	"time_zone" text NOT NULL,
	"digest_hour" smallint DEFAULT 6 NOT NULL,
	"repeat_window_days" smallint DEFAULT 90 NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "railroad_settings_singleton" CHECK ("railroad_settings"."id" = 1),
	CONSTRAINT "railroad_settings_digest_hour" CHECK ("railroad_settings"."digest_hour" between 0 and 23)
);
--> statement-breakpoint
CREATE TABLE "routines" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"person_id" uuid,
	"unit_type_key" text NOT NULL,
	"name" text NOT NULL,
	"start_point" text NOT NULL,
	"direction" text NOT NULL,
	"areas" jsonb NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "routines_direction" CHECK (direction in ('clockwise', 'counterclockwise'))
);
--> statement-breakpoint
CREATE TABLE "session" (
	"sid" varchar PRIMARY KEY NOT NULL,
	"sess" json NOT NULL,
	"expire" timestamp (6) NOT NULL
);
--> statement-breakpoint
CREATE TABLE "unit_dates" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"unit_id" uuid NOT NULL,
	"label" text NOT NULL,
	"interval_days" integer NOT NULL,
	"last_done_on" date NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "unit_dates_interval" CHECK ("unit_dates"."interval_days" > 0)
);
--> statement-breakpoint
CREATE TABLE "unit_tags" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"unit_id" uuid NOT NULL,
	"opened_at" timestamp with time zone DEFAULT now() NOT NULL,
	"opened_by" uuid NOT NULL,
	"place" text NOT NULL,
	"destination" text,
	"restrictions" text,
	"cleared_at" timestamp with time zone,
	"cleared_by" uuid
);
--> statement-breakpoint
CREATE TABLE "unit_types" (
	"key" text PRIMARY KEY NOT NULL,
	"name" text NOT NULL,
	"length_in" double precision NOT NULL,
	"width_in" double precision NOT NULL,
	"axle_count" smallint NOT NULL,
	"drawing_file" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "units" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"road_number" varchar(12) NOT NULL,
	"unit_type_key" text NOT NULL,
	"front_end" text NOT NULL,
	"yard_id" uuid,
	"service_state" text DEFAULT 'in_service' NOT NULL,
	"condition_monitoring" boolean DEFAULT false NOT NULL,
	"hump_stencilled" boolean DEFAULT false NOT NULL,
	"non_complying_since" timestamp with time zone,
	"last_periodic_on" date,
	"last_cm_check_on" date,
	"last_annual_on" date,
	"last_hand_brake_on" date,
	"last_main_reservoir_on" date,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "units_road_number_unique" UNIQUE("road_number"),
	CONSTRAINT "units_front_end" CHECK (front_end in ('short_hood', 'long_hood')),
	CONSTRAINT "units_service_state" CHECK (service_state in ('in_service', 'out_of_service', 'stored'))
);
--> statement-breakpoint
CREATE TABLE "yards" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"code" varchar(12) NOT NULL,
	"name" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "yards_code_unique" UNIQUE("code")
);
--> statement-breakpoint
ALTER TABLE "audit_log" ADD CONSTRAINT "audit_log_actor_id_people_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "finding_events" ADD CONSTRAINT "finding_events_finding_id_findings_id_fk" FOREIGN KEY ("finding_id") REFERENCES "public"."findings"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "finding_events" ADD CONSTRAINT "finding_events_actor_id_people_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "findings" ADD CONSTRAINT "findings_inspection_id_inspections_id_fk" FOREIGN KEY ("inspection_id") REFERENCES "public"."inspections"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "findings" ADD CONSTRAINT "findings_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "findings" ADD CONSTRAINT "findings_unit_type_key_unit_types_key_fk" FOREIGN KEY ("unit_type_key") REFERENCES "public"."unit_types"("key") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "findings" ADD CONSTRAINT "findings_assigned_to_people_id_fk" FOREIGN KEY ("assigned_to") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "findings" ADD CONSTRAINT "findings_created_by_people_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "idempotency_keys" ADD CONSTRAINT "idempotency_keys_person_id_people_id_fk" FOREIGN KEY ("person_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inspection_items" ADD CONSTRAINT "inspection_items_inspection_id_inspections_id_fk" FOREIGN KEY ("inspection_id") REFERENCES "public"."inspections"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inspections" ADD CONSTRAINT "inspections_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inspections" ADD CONSTRAINT "inspections_inspector_id_people_id_fk" FOREIGN KEY ("inspector_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inspections" ADD CONSTRAINT "inspections_yard_id_yards_id_fk" FOREIGN KEY ("yard_id") REFERENCES "public"."yards"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "inspections" ADD CONSTRAINT "inspections_routine_id_routines_id_fk" FOREIGN KEY ("routine_id") REFERENCES "public"."routines"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "people" ADD CONSTRAINT "people_yard_id_yards_id_fk" FOREIGN KEY ("yard_id") REFERENCES "public"."yards"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_finding_id_findings_id_fk" FOREIGN KEY ("finding_id") REFERENCES "public"."findings"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_created_by_people_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "routines" ADD CONSTRAINT "routines_person_id_people_id_fk" FOREIGN KEY ("person_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "routines" ADD CONSTRAINT "routines_unit_type_key_unit_types_key_fk" FOREIGN KEY ("unit_type_key") REFERENCES "public"."unit_types"("key") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_dates" ADD CONSTRAINT "unit_dates_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_tags" ADD CONSTRAINT "unit_tags_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_tags" ADD CONSTRAINT "unit_tags_opened_by_people_id_fk" FOREIGN KEY ("opened_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_tags" ADD CONSTRAINT "unit_tags_cleared_by_people_id_fk" FOREIGN KEY ("cleared_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_unit_type_key_unit_types_key_fk" FOREIGN KEY ("unit_type_key") REFERENCES "public"."unit_types"("key") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_yard_id_yards_id_fk" FOREIGN KEY ("yard_id") REFERENCES "public"."yards"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "audit_at" ON "audit_log" USING btree ("at");--> statement-breakpoint
CREATE INDEX "audit_entity" ON "audit_log" USING btree ("entity","entity_id");--> statement-breakpoint
CREATE INDEX "finding_events_finding_at" ON "finding_events" USING btree ("finding_id","at");--> statement-breakpoint
CREATE INDEX "findings_unit_state" ON "findings" USING btree ("unit_id","state");--> statement-breakpoint
CREATE INDEX "findings_state_weight" ON "findings" USING btree ("state","weight");--> statement-breakpoint
CREATE INDEX "findings_type_created" ON "findings" USING btree ("unit_type_key","created_at");--> statement-breakpoint
CREATE INDEX "findings_inspection" ON "findings" USING btree ("inspection_id");--> statement-breakpoint
CREATE INDEX "findings_repeat" ON "findings" USING btree ("unit_id","instance_id","defect_type","repaired_at");--> statement-breakpoint
CREATE UNIQUE INDEX "findings_idem" ON "findings" USING btree ("created_by","idempotency_key");--> statement-breakpoint
CREATE INDEX "inspections_unit_started" ON "inspections" USING btree ("unit_id","started_at");--> statement-breakpoint
CREATE INDEX "inspections_inspector_status" ON "inspections" USING btree ("inspector_id","status");--> statement-breakpoint
CREATE INDEX "inspections_started" ON "inspections" USING btree ("started_at");--> statement-breakpoint
CREATE UNIQUE INDEX "inspections_idem" ON "inspections" USING btree ("inspector_id","idempotency_key");--> statement-breakpoint
CREATE INDEX "outbox_due" ON "notifications_outbox" USING btree ("status","next_attempt_at");--> statement-breakpoint
CREATE UNIQUE INDEX "outbox_dedupe" ON "notifications_outbox" USING btree ("dedupe_key","to_address");--> statement-breakpoint
CREATE UNIQUE INDEX "people_email_lower" ON "people" USING btree (lower("email"));--> statement-breakpoint
CREATE INDEX "people_yard_role" ON "people" USING btree ("yard_id","role");--> statement-breakpoint
CREATE INDEX "photos_finding" ON "photos" USING btree ("finding_id");--> statement-breakpoint
CREATE UNIQUE INDEX "routines_owner_type" ON "routines" USING btree (coalesce("person_id", '00000000-0000-0000-0000-000000000000'::uuid),"unit_type_key");--> statement-breakpoint
CREATE INDEX "IDX_session_expire" ON "session" USING btree ("expire");--> statement-breakpoint
CREATE INDEX "unit_dates_unit" ON "unit_dates" USING btree ("unit_id");--> statement-breakpoint
CREATE INDEX "unit_tags_unit" ON "unit_tags" USING btree ("unit_id","cleared_at");--> statement-breakpoint
CREATE UNIQUE INDEX "unit_tags_one_open" ON "unit_tags" USING btree ("unit_id") WHERE "unit_tags"."cleared_at" is null;--> statement-breakpoint
CREATE INDEX "units_yard" ON "units" USING btree ("yard_id");--> statement-breakpoint
CREATE INDEX "units_type" ON "units" USING btree ("unit_type_key");