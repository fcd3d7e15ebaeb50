/**
 * Defect types: what an inspector can say is wrong with each kind of part.
 * `federal` types break a federal rule (the unit is non-complying until
 * repaired), `shop` types break a railroad standard, `note` types are worth
 * watching. A section is cited only where our rules reference supports it;
 * `ruleConfidence` says whether that section's text was seen ('seen', which
 * includes faithful secondary quotes) or is recalled from memory ('memory').
 */
import { PART_KIND_KEYS, PART_KINDS, type PartKind } from '../domain/parts';
import type { CheckKey } from '../checks';
import type { LengthUnit } from '../checks/units';
import type { RuleConfidence } from '../checks/result';

export const DEFECT_WEIGHTS = ['federal', 'shop', 'note'] as const;
export type DefectWeight = (typeof DEFECT_WEIGHTS)[number];

export interface DefectMeasurement {
  readonly quantity: 'length';
  readonly defaultUnit: LengthUnit;
}

export interface DefectType {
  /** snake_case, unique across the whole catalogue. */
  readonly key: string;
  readonly label: string;
  readonly partKind: PartKind;
  readonly weight: DefectWeight;
  /** e.g. '49 CFR 229.123' or '49 CFR Part 231'. */
  readonly rule?: string;
  /** Present exactly when `rule` is. */
  readonly ruleConfidence?: RuleConfidence;
  /** The rule check a measurement on this defect runs (a key of CHECKS). */
  readonly check?: CheckKey;
  /** Fixed inputs for that check, e.g. which interval or which kind of spot. */
  readonly checkPreset?: Readonly<Record<string, string | boolean>>;
  /** The reading the inspector enters, when the defect is gauged. */
  readonly measurement?: DefectMeasurement;
  /** Why the weight or citation is what it is, when that is not obvious. */
  readonly note?: string;
}

type Spec = Omit<DefectType, 'partKind' | 'key'> & { readonly key: string };

const LENGTH: DefectMeasurement = { quantity: 'length', defaultUnit: 'in' };
const seen = (rule: string) => ({ weight: 'federal' as const, rule, ruleConfidence: 'seen' as const });
const memory = (rule: string) => ({ weight: 'federal' as const, rule, ruleConfidence: 'memory' as const });
const shop = { weight: 'shop' as const };

const PART_231_NOTE = 'Part 231: 231.29 for road units with corner stairways, 231.30 for switching units; dimensions per the section.';
/** Bent, loose or missing safety appliance (steps, handrails, stanchions, uncoupling levers). */
const safetyAppliance = (prefix: string, noun: string): Spec[] =>
  (['bent', 'loose', 'missing'] as const).map((what) => ({
    key: `${prefix}_${what}`,
    label: `${noun} ${what}`,
    ...seen('49 CFR Part 231'),
    note: PART_231_NOTE,
  }));

const hood = (prefix: 'short_hood' | 'long_hood'): Spec[] => [
  { key: `${prefix}_danger_marking_missing`, label: '"Danger" marking missing on a high-voltage door or cover', ...memory('49 CFR 229.85') },
  { key: `${prefix}_door_unlatched`, label: 'Hood door will not latch', ...shop },
  { key: `${prefix}_panel_damaged`, label: 'Hood panel damaged', ...shop },
];

const SPECS: Partial<Record<PartKind, readonly Spec[]>> = {
  cab: [
    { key: 'cab_seat_loose', label: 'Seat not securely mounted', ...memory('49 CFR 229.119') },
    { key: 'cab_floor_slip_trip', label: 'Oil, water or obstruction on the cab floor', ...memory('49 CFR 229.119') },
    { key: 'cab_heat_inadequate', label: 'Cab heater cannot hold 60 °F', ...memory('49 CFR 229.119') },
    { key: 'daily_record_missing', label: 'Record of the previous daily inspection missing from the cab', ...seen('49 CFR 229.21(a)') },
    {
      key: 'daily_inspection_overdue',
      label: 'No daily inspection this calendar day',
      ...seen('49 CFR 229.21'),
      check: 'interval',
      checkPreset: { interval: 'daily' },
    },
    {
      key: 'periodic_overdue',
      label: 'Periodic inspection overdue',
      ...seen('49 CFR 229.23(a)'),
      check: 'interval',
      checkPreset: { interval: 'periodic' },
    },
    {
      key: 'periodic_cm_overdue',
      label: 'Periodic inspection overdue (condition-monitored unit)',
      ...seen('49 CFR 229.23(b)'),
      check: 'interval',
      checkPreset: { interval: 'periodic_cm' },
    },
    {
      key: 'qmi_daily_overdue',
      label: '33-day inspection by a qualified mechanical inspector overdue',
      ...seen('49 CFR 229.23(b)'),
      check: 'interval',
      checkPreset: { interval: 'cm_33_day' },
    },
    {
      key: 'annual_tests_overdue',
      label: 'Annual tests overdue',
      ...seen('49 CFR 229.27'),
      check: 'interval',
      checkPreset: { interval: 'annual' },
    },
    {
      key: 'blue_card_not_displayed',
      label: 'Periodic inspection card not displayed in the cab',
      ...memory('49 CFR 229.23(e)'),
      note: 'The card itself is seen in 229.23(e); where it is displayed is from memory.',
    },
  ],
  short_hood: hood('short_hood'),
  long_hood: hood('long_hood'),
  cab_door: [
    { key: 'cab_door_latch_defective', label: 'Cab door latch not secure or not working', ...memory('49 CFR 229.119') },
    { key: 'cab_door_damaged', label: 'Cab door damaged', ...shop },
  ],
  cab_window: [
    {
      key: 'cab_window_broken',
      label: 'Cab window broken, no clear view',
      ...seen('49 CFR 223.11'),
      note: 'Older text of 223.11 seen; revised in 2016, check the current text.',
    },
    { key: 'cab_window_view_distorted', label: 'Lead cab window gives a distorted view', ...memory('49 CFR 229.119') },
    { key: 'cab_window_wiper_inoperative', label: 'Window wiper not working', ...shop },
  ],
  horn: [
    { key: 'horn_inoperative', label: 'Horn does not sound', ...seen('49 CFR 229.129') },
    { key: 'horn_control_defective', label: 'Horn control hard to reach or sticking', ...seen('49 CFR 229.129(a)') },
  ],
  number_board: [
    {
      key: 'number_illegible',
      label: 'Unit number not clearly legible',
      ...seen('49 CFR 229.11'),
      note: '229.11 asks for the number clearly legible on each side; the number board shows it at the end.',
    },
    { key: 'number_board_light_out', label: 'Number board light out', ...shop },
  ],
  headlight: [
    { key: 'headlight_inoperative', label: 'Headlight out', ...seen('49 CFR 229.125(a)') },
    { key: 'headlight_dimmer_inoperative', label: 'Headlight dimmer not working', ...seen('49 CFR 229.125(c)') },
    { key: 'headlight_misaimed', label: 'Headlight not aimed along the track', ...memory('49 CFR 229.125(a)') },
    { key: 'headlight_lens_damaged', label: 'Headlight lens cracked or dirty', ...shop },
  ],
  ditch_light: [
    { key: 'ditch_light_inoperative', label: 'Ditch light out', ...seen('49 CFR 229.125(d)') },
    { key: 'ditch_light_flash_defective', label: 'Ditch lights not alternating when flashing', ...seen('49 CFR 229.125(e)') },
    { key: 'ditch_light_misaimed', label: 'Ditch light aimed wrong', ...memory('49 CFR 229.125(d)') },
    { key: 'ditch_light_lens_damaged', label: 'Ditch light lens cracked or dirty', ...shop },
  ],
  nose_compartment: [
    { key: 'nose_door_unsecured', label: 'Nose compartment door not secured', ...shop },
    { key: 'nose_compartment_water', label: 'Water or debris in the nose compartment', ...shop },
  ],
  walkway: [
    { key: 'walkway_slip_trip', label: 'Oil, ice, debris or obstruction on the walkway', ...memory('49 CFR 229.119') },
    { key: 'walkway_grating_damaged', label: 'Walkway grating or tread damaged', ...shop },
  ],
  handrail: safetyAppliance('handrail', 'Handrail'),
  end_handrail: safetyAppliance('end_handrail', 'End handrail'),
  stanchion: safetyAppliance('stanchion', 'Stanchion'),
  step: [
    ...safetyAppliance('step', 'Step'),
    {
      key: 'end_footboard_present',
      label: 'End footboard fitted (prohibited)',
      ...seen('49 CFR 231.30'),
      note: 'Switching units; 231.30 dates apply.',
    },
  ],
  uncoupling_lever: [
    ...safetyAppliance('uncoupling_lever', 'Uncoupling lever'),
    { key: 'uncoupling_lever_inoperative', label: 'Uncoupling lever does not lift the lock', ...seen('49 CFR Part 231'), note: PART_231_NOTE },
  ],
  battery_box: [
    { key: 'battery_box_vent_blocked', label: 'Battery box vent blocked', ...seen('49 CFR 229.43') },
    { key: 'battery_gassing', label: 'Battery gassing excessively', ...seen('49 CFR 229.43') },
    { key: 'battery_box_cover_missing', label: 'Battery box cover missing or loose', ...shop },
  ],
  sand_box: [
    {
      key: 'sander_inoperative',
      label: 'Sander not putting sand on the rail',
      ...seen('49 CFR 229.131'),
      check: 'sanders',
      note: 'En route on a lead road unit: at most 14 calendar days, 229.131(b).',
    },
    { key: 'sand_low', label: 'Sand low', ...shop },
    { key: 'sand_box_lid_missing', label: 'Sand box lid missing', ...shop },
  ],
  mu_receptacle: [
    { key: 'mu_insulation_chafed', label: 'MU cable insulation broken or badly chafed', ...seen('49 CFR 229.89') },
    { key: 'mu_receptacle_broken', label: 'MU plug, receptacle or terminal broken', ...seen('49 CFR 229.89') },
    { key: 'mu_strands_protruding', label: 'MU wire strands broken or protruding', ...seen('49 CFR 229.89') },
    { key: 'mu_jumper_hanging', label: 'MU jumper hanging with one end free', ...seen('49 CFR 229.89') },
    { key: 'mu_cover_missing', label: 'MU receptacle cover missing', ...shop },
  ],
  coupler: [
    {
      key: 'coupler_knuckle_gap',
      label: 'Guard arm to knuckle nose distance over limit',
      ...memory('49 CFR 229.61'),
      measurement: LENGTH,
      note: 'Limit from memory (5 1/8 in standard contour); no computed check yet.',
    },
    { key: 'coupler_cracked', label: 'Coupler or knuckle cracked or broken', ...memory('49 CFR 229.61') },
    { key: 'coupler_anti_creep_missing', label: 'Coupler lock has no anti-creep protection', ...memory('49 CFR 229.61') },
    { key: 'draft_gear_slack', label: 'Free slack in the draft gear', ...memory('49 CFR 229.61') },
  ],
  air_hose: [
    { key: 'air_hose_leaking', label: 'Air hose leaking', ...shop },
    { key: 'air_hose_chafed', label: 'Air hose chafed or cut', ...shop },
    { key: 'glad_hand_gasket_missing', label: 'Glad hand gasket missing', ...shop },
  ],
  pilot: [
    {
      key: 'pilot_height_out_of_limit',
      label: 'Pilot height above rail out of limit',
      ...seen('49 CFR 229.123'),
      check: 'pilot_height',
      measurement: LENGTH,
    },
    { key: 'pilot_missing', label: 'No pilot, plow or end plate across both rails', ...seen('49 CFR 229.123(a)') },
    {
      key: 'pilot_stencil_missing',
      label: '9-inch end plate stencil missing at an end',
      ...seen('49 CFR 229.123(b)'),
    },
    { key: 'pilot_bent', label: 'Pilot bent', ...shop },
  ],
  hand_brake: [
    { key: 'hand_brake_inoperative', label: 'Hand brake does not apply or release', ...memory('49 CFR 232.105') },
    {
      key: 'hand_brake_date_overdue',
      label: 'Hand brake inspection date overdue',
      ...memory('49 CFR 232.105(c)'),
      check: 'interval',
      checkPreset: { interval: 'hand_brake' },
    },
    { key: 'hand_brake_date_missing', label: 'Hand brake inspection date not recorded', ...memory('49 CFR 232.105(c)') },
    { key: 'hand_brake_wheel_damaged', label: 'Hand brake wheel or lever damaged', ...shop },
  ],
  hand_brake_chain: [
    {
      key: 'chain_worn',
      label: 'Chain links worn',
      ...memory('49 CFR 232.105'),
      check: 'chain_wear',
      measurement: LENGTH,
      note: 'No federal chain-wear limit is known; a chain worn past 30 % (common practice, no source) makes the hand brake defective.',
    },
    { key: 'chain_disconnected', label: 'Chain broken or disconnected', ...memory('49 CFR 232.105') },
    { key: 'chain_kinked', label: 'Chain kinked or twisted', ...shop },
    { key: 'chain_pulley_seized', label: 'Chain pulley seized', ...shop },
  ],
  fuel_tank: [
    { key: 'fuel_tank_leak', label: 'Fuel tank leaking', ...shop },
    { key: 'fuel_tank_damaged', label: 'Fuel tank dented or punctured', ...shop },
    { key: 'fuel_cap_missing', label: 'Fuel filler cap missing', ...shop },
  ],
  truck: [
    { key: 'truck_frame_cracked', label: 'Truck frame cracked in a stress area', ...seen('49 CFR 229.67') },
    { key: 'truck_casting_cracked', label: 'Center casting, equalizer, hanger, gib or pin cracked or broken', ...seen('49 CFR 229.67') },
    { key: 'truck_tie_bar_loose', label: 'Tie bar loose', ...seen('49 CFR 229.67') },
    { key: 'side_bearing_clearance', label: 'Side bearing clearance over limit', ...seen('49 CFR 229.69'), measurement: LENGTH },
  ],
  axle: [
    { key: 'axle_lateral_excess', label: 'Uncontrolled lateral motion over limit', ...seen('49 CFR 229.63'), measurement: LENGTH },
    { key: 'journal_box_no_oil', label: 'Plain bearing box shows no free oil', ...seen('49 CFR 229.64') },
    { key: 'axle_bearing_hot', label: 'Roller bearing running hot', ...shop },
  ],
  wheel: [
    {
      key: 'flat_spot',
      label: 'Flat spot',
      ...seen('49 CFR 229.75(a)'),
      check: 'wheel_flat',
      checkPreset: { spot: 'flat' },
      measurement: LENGTH,
    },
    {
      key: 'shelled_spot',
      label: 'Shelled spot',
      ...seen('49 CFR 229.75(d)'),
      check: 'wheel_flat',
      checkPreset: { spot: 'shelled' },
      measurement: LENGTH,
    },
    { key: 'flange_thin', label: 'Flange worn thin', ...seen('49 CFR 229.75(f)'), check: 'flange_thickness', measurement: LENGTH },
    { key: 'rim_thin', label: 'Rim worn thin', ...seen('49 CFR 229.75(j)'), check: 'rim_thickness', measurement: LENGTH },
    { key: 'tread_hollow', label: 'Tread worn hollow', ...seen('49 CFR 229.75(g)'), check: 'tread_hollow', measurement: LENGTH },
    { key: 'chipped_flange', label: 'Flange chipped or gouged', ...seen('49 CFR 229.75(b)'), measurement: LENGTH },
    { key: 'broken_rim', label: 'Rim broken', ...seen('49 CFR 229.75(c)'), measurement: LENGTH },
    { key: 'wheel_seam', label: 'Seam in the tread near the flange', ...seen('49 CFR 229.75(e)'), measurement: LENGTH },
    { key: 'flange_high', label: 'Flange too high', ...memory('49 CFR 229.75(h)'), measurement: LENGTH },
    { key: 'wheel_cracked', label: 'Wheel cracked or broken', ...memory('49 CFR 229.75') },
    { key: 'wheel_welded', label: 'Wheel fusion-welded', ...seen('49 CFR 229.75(m)'), note: 'Allowed only on units used exclusively in yard service.' },
  ],
  traction_motor: [
    {
      key: 'motor_suspension_lug_cracked',
      label: 'Motor suspension lug cracked or broken',
      ...seen('49 CFR 229.67'),
    },
    { key: 'gear_case_leaking', label: 'Gear case leaking lubricant', ...shop },
    { key: 'traction_motor_cable_chafed', label: 'Traction motor cable chafed', ...shop },
  ],
  air_reservoir: [
    {
      key: 'reservoir_test_overdue',
      label: 'Main reservoir hydrostatic / hammer test overdue',
      ...seen('49 CFR 229.31'),
      check: 'interval',
      checkPreset: { interval: 'main_reservoir' },
    },
    { key: 'reservoir_safety_valve_defective', label: 'Main reservoir safety valve defective', ...seen('49 CFR 229.49') },
    { key: 'reservoir_drain_defective', label: 'Reservoir drain valve defective', ...shop },
    { key: 'reservoir_leaking', label: 'Reservoir or fitting leaking', ...shop },
  ],
  front_marking: [
    {
      key: 'front_marking_missing',
      label: 'F marking missing',
      ...shop,
      note: 'No federal rule known; the F is the trade convention that defines front, left and right.',
    },
    { key: 'front_marking_illegible', label: 'F marking illegible', ...shop },
    {
      key: 'front_marking_mismatch',
      label: 'F found on the other end from the unit record',
      ...shop,
      note: 'Raised by Hoodline when the inspector confirms the F on the end the record does not say; the foreman and admin correct the record.',
    },
  ],
};

const other = (partKind: PartKind): DefectType => ({
  key: `${partKind}_other`,
  label: `Other ${PART_KINDS[partKind].label} defect (describe)`,
  partKind,
  weight: 'note',
});

/** Every defect type, grouped by part kind in catalogue order; each kind ends with its generic `other`. */
export const DEFECT_TYPES: readonly DefectType[] = PART_KIND_KEYS.flatMap((partKind) => [
  ...(SPECS[partKind] ?? []).map((s): DefectType => ({ ...s, partKind })),
  other(partKind),
]);

const byKey = new Map(DEFECT_TYPES.map((d) => [d.key, d]));
const byPart = new Map<PartKind, DefectType[]>();
for (const d of DEFECT_TYPES) byPart.set(d.partKind, [...(byPart.get(d.partKind) ?? []), d]);

/** Defect types an inspector can choose for a part of this kind. */
export const defectTypesFor = (partKind: PartKind): readonly DefectType[] => byPart.get(partKind) ?? [];

/** The defect type with this key, or undefined. */
export const defectTypeByKey = (key: string): DefectType | undefined => byKey.get(key);
