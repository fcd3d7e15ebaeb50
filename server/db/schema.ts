import { sql } from 'drizzle-orm';
import {
  bigserial,
  boolean,
  check,
  customType,
  date,
  doublePrecision,
  index,
  integer,
  json,
  jsonb,
  numeric,
  pgTable,
  primaryKey,
  smallint,
  text,
  timestamp,
  uniqueIndex,
  uuid,
  varchar,
} from 'drizzle-orm/pg-core';

const ts = (name: string) => timestamp(name, { withTimezone: true, mode: 'date' });
const created = () => ts('created_at').notNull().defaultNow();
const inList = (col: string, values: readonly string[]) =>
  sql.raw(`${col} in (${values.map((v) => `'${v}'`).join(', ')})`);

export const railroadSettings = pgTable(
  'railroad_settings',
  {
    id: smallint('id').primaryKey().default(1),
    name: text('name').notNull(),
    reportingMark: varchar('reporting_mark', { length: 4 }).notNull(),
    timeZone: text('time_zone').notNull(),
    /** Local hour (0–23) at which the daily due digest goes out. */
    digestHour: smallint('digest_hour').notNull().default(6),
    repeatWindowDays: smallint('repeat_window_days').notNull().default(90),
    updatedAt: ts('updated_at').notNull().defaultNow(),
  },
  (t) => [
    check('railroad_settings_singleton', sql`${t.id} = 1`),
    check('railroad_settings_digest_hour', sql`${t.digestHour} between 0 and 23`),
  ],
);

export const yards = pgTable('yards', {
  id: uuid('id').primaryKey().defaultRandom(),
  code: varchar('code', { length: 12 }).notNull().unique(),
  name: text('name').notNull(),
  createdAt: created(),
});

export const people = pgTable(
  'people',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    email: text('email').notNull(),
    name: text('name').notNull(),
    role: text('role').notNull(),
    active: boolean('active').notNull().default(true),
    passwordHash: text('password_hash').notNull(),
    yardId: uuid('yard_id').references(() => yards.id),
    failedLogins: integer('failed_logins').notNull().default(0),
    lockedUntil: ts('locked_until'),
    /** Sessions issued before this instant are refused ("sign out everywhere"). */
    sessionsValidAfter: ts('sessions_valid_after'),
    version: integer('version').notNull().default(1),
    createdAt: created(),
    updatedAt: ts('updated_at').notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('people_email_lower').on(sql`lower(${t.email})`),
    check('people_role', inList('role', ['inspector', 'foreman', 'engineer', 'trainer', 'admin'])),
    index('people_yard_role').on(t.yardId, t.role),
  ],
);

/** The express-session store's table, exactly as connect-pg-simple expects it. */
export const session = pgTable(
  'session',
  {
    sid: varchar('sid').primaryKey(),
    sess: json('sess').notNull(),
    expire: timestamp('expire', { precision: 6, mode: 'date' }).notNull(),
  },
  (t) => [index('IDX_session_expire').on(t.expire)],
);

export const unitTypes = pgTable('unit_types', {
  key: text('key').primaryKey(),
  name: text('name').notNull(),
  lengthIn: doublePrecision('length_in').notNull(),
  widthIn: doublePrecision('width_in').notNull(),
  axleCount: smallint('axle_count').notNull(),
  drawingFile: text('drawing_file').notNull(),
  createdAt: created(),
});

export const units = pgTable(
  'units',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    roadNumber: varchar('road_number', { length: 12 }).notNull().unique(),
    unitTypeKey: text('unit_type_key')
      .notNull()
      .references(() => unitTypes.key),
    frontEnd: text('front_end').notNull(),
    yardId: uuid('yard_id').references(() => yards.id),
    serviceState: text('service_state').notNull().default('in_service'),
    /** Unit carries on-board condition monitoring (184-day periodic with a 33-day check). */
    conditionMonitoring: boolean('condition_monitoring').notNull().default(false),
    /** Stencilled at each end for hump-yard service (49 CFR 229.123(b)). */
    humpStencilled: boolean('hump_stencilled').notNull().default(false),
    nonComplyingSince: ts('non_complying_since'),
    lastPeriodicOn: date('last_periodic_on', { mode: 'string' }),
    lastCmCheckOn: date('last_cm_check_on', { mode: 'string' }),
    lastAnnualOn: date('last_annual_on', { mode: 'string' }),
    lastHandBrakeOn: date('last_hand_brake_on', { mode: 'string' }),
    lastMainReservoirOn: date('last_main_reservoir_on', { mode: 'string' }),
    version: integer('version').notNull().default(1),
    createdAt: created(),
    updatedAt: ts('updated_at').notNull().defaultNow(),
  },
  (t) => [
    check('units_front_end', inList('front_end', ['short_hood', 'long_hood'])),
    check('units_service_state', inList('service_state', ['in_service', 'out_of_service', 'stored'])),
    index('units_yard').on(t.yardId),
    index('units_type').on(t.unitTypeKey),
  ],
);

/** Extra dated items a railroad tracks per unit beyond the federal ones. */
export const unitDates = pgTable(
  'unit_dates',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    unitId: uuid('unit_id')
      .notNull()
      .references(() => units.id),
    label: text('label').notNull(),
    intervalDays: integer('interval_days').notNull(),
    lastDoneOn: date('last_done_on', { mode: 'string' }).notNull(),
    createdAt: created(),
  },
  (t) => [index('unit_dates_unit').on(t.unitId), check('unit_dates_interval', sql`${t.intervalDays} > 0`)],
);

export const routines = pgTable(
  'routines',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    /** Null for the default routine of a unit type. */
    personId: uuid('person_id').references(() => people.id),
    unitTypeKey: text('unit_type_key')
      .notNull()
      .references(() => unitTypes.key),
    name: text('name').notNull(),
    startPoint: text('start_point').notNull(),
    direction: text('direction').notNull(),
    /** Ordered areas: [{ key, label, hazard, instanceIds: [...] }]. */
    areas: jsonb('areas').notNull(),
    version: integer('version').notNull().default(1),
    updatedAt: ts('updated_at').notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('routines_owner_type').on(sql`coalesce(${t.personId}, '00000000-0000-0000-0000-000000000000'::uuid)`, t.unitTypeKey),
    check('routines_direction', inList('direction', ['clockwise', 'counterclockwise'])),
  ],
);

export const inspections = pgTable(
  'inspections',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    unitId: uuid('unit_id')
      .notNull()
      .references(() => units.id),
    inspectorId: uuid('inspector_id')
      .notNull()
      .references(() => people.id),
    kind: text('kind').notNull(),
    status: text('status').notNull().default('in_progress'),
    /** The F end the inspector saw, and what the record said when they started. */
    frontEndSeen: text('front_end_seen').notNull(),
    frontEndRecorded: text('front_end_recorded').notNull(),
    yardId: uuid('yard_id').references(() => yards.id),
    routineId: uuid('routine_id').references(() => routines.id),
    /** Frozen copy of the routine used, so later routine edits never change a record. */
    routineSnapshot: jsonb('routine_snapshot'),
    startedAt: ts('started_at').notNull().defaultNow(),
    signedAt: ts('signed_at'),
    /** Correction entries point at the signed record they correct. */
    correctsId: uuid('corrects_id'),
    correctionNote: text('correction_note'),
    version: integer('version').notNull().default(1),
    idempotencyKey: text('idempotency_key'),
  },
  (t) => [
    check('inspections_kind', inList('kind', ['daily', 'periodic'])),
    check('inspections_status', inList('status', ['in_progress', 'signed'])),
    check('inspections_front_seen', inList('front_end_seen', ['short_hood', 'long_hood'])),
    check('inspections_front_recorded', inList('front_end_recorded', ['short_hood', 'long_hood'])),
    check('inspections_signed_has_time', sql`(${t.status} = 'signed') = (${t.signedAt} is not null)`),
    index('inspections_unit_started').on(t.unitId, t.startedAt),
    index('inspections_inspector_status').on(t.inspectorId, t.status),
    index('inspections_started').on(t.startedAt),
    uniqueIndex('inspections_idem').on(t.inspectorId, t.idempotencyKey),
    // An inspection's view lists its corrections; without this every view read the whole table.
    index('inspections_corrects').on(t.correctsId).where(sql`${t.correctsId} is not null`),
  ],
);

export const inspectionItems = pgTable(
  'inspection_items',
  {
    inspectionId: uuid('inspection_id')
      .notNull()
      .references(() => inspections.id),
    instanceId: text('instance_id').notNull(),
    state: text('state').notNull(),
    reason: text('reason'),
    updatedAt: ts('updated_at').notNull().defaultNow(),
  },
  (t) => [
    primaryKey({ columns: [t.inspectionId, t.instanceId] }),
    check('inspection_items_state', inList('state', ['passed', 'finding', 'not_applicable', 'gap'])),
  ],
);

export const findings = pgTable(
  'findings',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    inspectionId: uuid('inspection_id')
      .notNull()
      .references(() => inspections.id),
    unitId: uuid('unit_id')
      .notNull()
      .references(() => units.id),
    unitTypeKey: text('unit_type_key')
      .notNull()
      .references(() => unitTypes.key),
    partId: text('part_id').notNull(),
    instanceId: text('instance_id').notNull(),
    partKind: text('part_kind').notNull(),
    view: text('view').notNull(),
    bodyX: doublePrecision('body_x').notNull(),
    bodyY: doublePrecision('body_y').notNull(),
    bodyZ: doublePrecision('body_z').notNull(),
    frontAlong: doublePrecision('front_along').notNull(),
    frontLeft: doublePrecision('front_left').notNull(),
    /** The F end at the moment of the pin, and the labels derived then. */
    frontEnd: text('front_end').notNull(),
    label: text('label').notNull(),
    partLabel: text('part_label').notNull(),
    side: text('side').notNull(),
    endRole: text('end_role'),
    number: smallint('number'),
    defectType: text('defect_type').notNull(),
    weight: text('weight').notNull(),
    rule: text('rule'),
    measurementValue: doublePrecision('measurement_value'),
    measurementUnit: text('measurement_unit'),
    measurementIn: doublePrecision('measurement_in'),
    checkResult: jsonb('check_result'),
    note: text('note'),
    state: text('state').notNull().default('open'),
    assignedTo: uuid('assigned_to').references(() => people.id),
    createdBy: uuid('created_by')
      .notNull()
      .references(() => people.id),
    createdAt: created(),
    updatedAt: ts('updated_at').notNull().defaultNow(),
    repairedAt: ts('repaired_at'),
    voidReason: text('void_reason'),
    version: integer('version').notNull().default(1),
    idempotencyKey: text('idempotency_key'),
    /**
     * Calendar days (railroad zone) from the latest repair of a non-voided finding of the same unit,
     * physical part and defect type, repaired no later than this one was found, to this one's day;
     * null when there is none. Kept at write time so the repeat rule is one comparison at query time.
     */
    priorRepairDays: integer('prior_repair_days'),
  },
  (t) => [
    check('findings_state', inList('state', ['open', 'in_repair', 'repaired', 'verified', 'voided'])),
    check('findings_weight', inList('weight', ['federal', 'shop', 'note'])),
    check('findings_front_end', inList('front_end', ['short_hood', 'long_hood'])),
    check('findings_side', inList('side', ['left', 'right', 'center'])),
    check('findings_unit', sql`${t.measurementUnit} is null or ${t.measurementUnit} in ('in', 'mm')`),
    check('findings_voided_reason', sql`${t.state} <> 'voided' or ${t.voidReason} is not null`),
    index('findings_unit_state').on(t.unitId, t.state),
    index('findings_state_weight').on(t.state, t.weight),
    // (unit type, created_at) lookups use findings_hot_spots_cover, which begins with the same two columns.
    index('findings_inspection').on(t.inspectionId),
    index('findings_repeat').on(t.unitId, t.instanceId, t.defectType, t.repairedAt),
    // Hot spots read a unit type's findings in a date range from this index alone (an index-only
    // scan): every column the screen groups, counts or filters on, the repeat day count included.
    index('findings_hot_spots_cover').on(
      t.unitTypeKey, t.createdAt, t.state, t.partKind, t.label, t.partLabel, t.unitId,
      t.defectType, t.weight, t.inspectionId, t.frontAlong, t.frontLeft, t.priorRepairDays,
    ),
    // …and count each unit type's findings by part kind (the fleet baseline) one range per kind.
    index('findings_hot_spots_kinds').on(t.unitTypeKey, t.partKind, t.createdAt, t.state, t.defectType, t.weight, t.inspectionId),
    uniqueIndex('findings_idem').on(t.createdBy, t.idempotencyKey),
  ],
);

/*
 * The hot spots summary: the non-voided findings counted per unit type and civil month (railroad zone),
 * kept by statement triggers on findings in the writing transaction and rebuilt when the zone, the
 * repeat window or a unit type's width changes (drizzle/0005_hot_spots_summary.sql). The screen reads
 * whole months from here and only the partial months at the ends of its range from findings.
 */
export const hotSpotsByLabel = pgTable(
  'hot_spots_by_label',
  {
    unitTypeKey: text('unit_type_key').notNull(),
    month: date('month').notNull(),
    label: text('label').notNull(),
    partKind: text('part_kind').notNull(),
    partLabel: text('part_label').notNull(),
    findings: integer('findings').notNull(),
    /** Findings that are repeats under the current repeat window. */
    repeats: integer('repeats').notNull(),
    /** Exact sums of the pins' front-relative positions (numeric, so adding and removing never drifts). */
    sumAlong: numeric('sum_along').notNull(),
    sumLeft: numeric('sum_left').notNull(),
  },
  (t) => [primaryKey({ name: 'hot_spots_by_label_pk', columns: [t.unitTypeKey, t.month, t.label, t.partKind, t.partLabel] })],
);

/** Pins per cell of the hot spots grid (12 in cells; clamped to the drawing when read). */
export const hotSpotsByCell = pgTable(
  'hot_spots_by_cell',
  {
    unitTypeKey: text('unit_type_key').notNull(),
    month: date('month').notNull(),
    col: integer('col').notNull(),
    row: integer('row').notNull(),
    findings: integer('findings').notNull(),
  },
  (t) => [primaryKey({ name: 'hot_spots_by_cell_pk', columns: [t.unitTypeKey, t.month, t.col, t.row] })],
);

export const hotSpotsByUnit = pgTable(
  'hot_spots_by_unit',
  {
    unitTypeKey: text('unit_type_key').notNull(),
    month: date('month').notNull(),
    unitId: uuid('unit_id').notNull(),
    findings: integer('findings').notNull(),
    repeats: integer('repeats').notNull(),
  },
  (t) => [primaryKey({ name: 'hot_spots_by_unit_pk', columns: [t.unitTypeKey, t.month, t.unitId] })],
);

/** The months in which a unit has findings on a part as named: units affected are distinct, not additive. */
export const hotSpotsLabelUnits = pgTable(
  'hot_spots_label_units',
  {
    unitTypeKey: text('unit_type_key').notNull(),
    label: text('label').notNull(),
    unitId: uuid('unit_id').notNull(),
    months: date('months').array().notNull(),
  },
  (t) => [primaryKey({ name: 'hot_spots_label_units_pk', columns: [t.unitTypeKey, t.label, t.unitId] })],
);

/**
 * Changes to the summary that single writes (a pin, a repair, a void) leave for the next fold
 * (drizzle/0007): appending here never waits on another writer, where adding to the shared summary
 * rows made every pin on the same part and month take turns. The hot spots screen folds before it
 * reads and the worker folds every few seconds, so the answer is the same as without it.
 */
const hotSpotsChanges = customType<{ data: string; driverData: string }>({ dataType: () => 'hot_spots_change[]' });
export const hotSpotsPending = pgTable('hot_spots_pending', {
  id: bigserial('id', { mode: 'number' }).primaryKey(),
  removed: hotSpotsChanges('removed'),
  added: hotSpotsChanges('added'),
});

export const photos = pgTable(
  'photos',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    findingId: uuid('finding_id').references(() => findings.id),
    findingEventId: uuid('finding_event_id'),
    storageKey: text('storage_key').notNull().unique(),
    thumbKey: text('thumb_key'),
    contentType: text('content_type').notNull(),
    sizeBytes: integer('size_bytes').notNull(),
    width: integer('width'),
    height: integer('height'),
    createdBy: uuid('created_by')
      .notNull()
      .references(() => people.id),
    createdAt: created(),
  },
  (t) => [
    check('photos_type', inList('content_type', ['image/jpeg', 'image/png', 'image/webp'])),
    index('photos_finding').on(t.findingId),
  ],
);

export const findingEvents = pgTable(
  'finding_events',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    findingId: uuid('finding_id')
      .notNull()
      .references(() => findings.id),
    kind: text('kind').notNull(),
    fromState: text('from_state'),
    toState: text('to_state'),
    actorId: uuid('actor_id')
      .notNull()
      .references(() => people.id),
    at: ts('at').notNull().defaultNow(),
    details: jsonb('details'),
  },
  (t) => [
    check(
      'finding_events_kind',
      inList('kind', ['created', 'assigned', 'repair_started', 'repaired', 'verified', 'sent_back', 'voided', 'noted']),
    ),
    index('finding_events_finding_at').on(t.findingId, t.at),
  ],
);

/** Non-complying tags (49 CFR 229.9): opened by a federal finding, cleared by a foreman. */
export const unitTags = pgTable(
  'unit_tags',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    unitId: uuid('unit_id')
      .notNull()
      .references(() => units.id),
    openedAt: ts('opened_at').notNull().defaultNow(),
    openedBy: uuid('opened_by')
      .notNull()
      .references(() => people.id),
    place: text('place').notNull(),
    destination: text('destination'),
    restrictions: text('restrictions'),
    clearedAt: ts('cleared_at'),
    clearedBy: uuid('cleared_by').references(() => people.id),
  },
  (t) => [
    index('unit_tags_unit').on(t.unitId, t.clearedAt),
    uniqueIndex('unit_tags_one_open').on(t.unitId).where(sql`${t.clearedAt} is null`),
  ],
);

export const outbox = pgTable(
  'notifications_outbox',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    kind: text('kind').notNull(),
    toAddress: text('to_address').notNull(),
    subject: text('subject').notNull(),
    body: text('body').notNull(),
    status: text('status').notNull().default('pending'),
    attempts: integer('attempts').notNull().default(0),
    nextAttemptAt: ts('next_attempt_at').notNull().defaultNow(),
    lastError: text('last_error'),
    /** One message per (dedupe key, address): a digest for a given day is never queued twice. */
    dedupeKey: text('dedupe_key'),
    createdAt: created(),
    sentAt: ts('sent_at'),
  },
  (t) => [
    check('outbox_status', inList('status', ['pending', 'sent', 'failed'])),
    index('outbox_due').on(t.status, t.nextAttemptAt),
    uniqueIndex('outbox_dedupe').on(t.dedupeKey, t.toAddress),
  ],
);

export const auditLog = pgTable(
  'audit_log',
  {
    id: bigserial('id', { mode: 'number' }).primaryKey(),
    at: ts('at').notNull().defaultNow(),
    actorId: uuid('actor_id').references(() => people.id),
    action: text('action').notNull(),
    entity: text('entity').notNull(),
    entityId: text('entity_id'),
    ip: text('ip'),
    details: jsonb('details'),
  },
  (t) => [index('audit_at').on(t.at), index('audit_entity').on(t.entity, t.entityId)],
);

/** Replayed responses for requests carrying an Idempotency-Key. */
export const idempotencyKeys = pgTable(
  'idempotency_keys',
  {
    personId: uuid('person_id')
      .notNull()
      .references(() => people.id),
    key: text('key').notNull(),
    method: text('method').notNull(),
    path: text('path').notNull(),
    status: integer('status').notNull(),
    response: jsonb('response'),
    createdAt: created(),
  },
  (t) => [primaryKey({ columns: [t.personId, t.key] })],
);

// Orientation lab: kept apart from inspection records; nothing here touches units, inspections or findings.
export const trainingGroups = pgTable('training_groups', {
  id: uuid('id').primaryKey().defaultRandom(),
  name: text('name').notNull().unique(),
  createdBy: uuid('created_by')
    .notNull()
    .references(() => people.id),
  createdAt: created(),
});

export const trainingGroupMembers = pgTable(
  'training_group_members',
  {
    groupId: uuid('group_id')
      .notNull()
      .references(() => trainingGroups.id),
    personId: uuid('person_id')
      .notNull()
      .references(() => people.id),
  },
  (t) => [primaryKey({ columns: [t.groupId, t.personId] })],
);

export const quizzes = pgTable(
  'quizzes',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    title: text('title').notNull(),
    /** Null: any unit type, picked at random per prompt. */
    unitTypeKey: text('unit_type_key').references(() => unitTypes.key),
    /** Prompt templates: [{ template, count, ... }]. */
    templates: jsonb('templates').notNull(),
    groupId: uuid('group_id').references(() => trainingGroups.id),
    createdBy: uuid('created_by')
      .notNull()
      .references(() => people.id),
    createdAt: created(),
    version: integer('version').notNull().default(1),
  },
  (t) => [index('quizzes_group').on(t.groupId)],
);

export const quizAttempts = pgTable(
  'quiz_attempts',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    quizId: uuid('quiz_id')
      .notNull()
      .references(() => quizzes.id),
    personId: uuid('person_id')
      .notNull()
      .references(() => people.id),
    /** The generated prompts (with the F end and expected answer), fixed at start so grading is repeatable. */
    prompts: jsonb('prompts').notNull(),
    startedAt: ts('started_at').notNull().defaultNow(),
    finishedAt: ts('finished_at'),
    score: integer('score'),
  },
  (t) => [index('quiz_attempts_quiz_person').on(t.quizId, t.personId)],
);

export const quizAnswers = pgTable(
  'quiz_answers',
  {
    attemptId: uuid('attempt_id')
      .notNull()
      .references(() => quizAttempts.id),
    promptIndex: integer('prompt_index').notNull(),
    answer: jsonb('answer').notNull(),
    correct: boolean('correct').notNull(),
    ms: integer('ms').notNull(),
    at: ts('at').notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.attemptId, t.promptIndex] }), check('quiz_answers_ms', sql`${t.ms} >= 0`)],
);
