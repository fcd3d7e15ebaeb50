/**
 * The part catalogue: every `data-part` value a drawing may use, with how a
 * person names it. `numbered` parts are counted 1..n from the front (per side
 * when also `sided`); `sided` parts carry left/right; `ended` parts belong to
 * the front or rear end.
 */
export interface PartKindSpec {
  readonly label: string;
  readonly plural: string;
  readonly numbered: boolean;
  readonly sided: boolean;
  readonly ended: boolean;
  /** Work on this part puts someone on, under or between equipment (shows the blue-signal caution). */
  readonly hazard: boolean;
}

const k = (label: string, plural: string, numbered: boolean, sided: boolean, ended: boolean, hazard = false): PartKindSpec => ({
  label, plural, numbered, sided, ended, hazard,
});

export const PART_KINDS = {
  cab: k('cab', 'cabs', false, false, false),
  short_hood: k('short hood', 'short hoods', false, false, false),
  long_hood: k('long hood', 'long hoods', false, false, false),
  cab_door: k('cab door', 'cab doors', false, true, false),
  cab_window: k('cab window', 'cab windows', false, true, true),
  horn: k('horn', 'horns', false, false, false, true),
  number_board: k('number board', 'number boards', false, true, true),
  headlight: k('headlight', 'headlights', false, false, true),
  ditch_light: k('ditch light', 'ditch lights', false, true, true),
  nose_compartment: k('nose compartment', 'nose compartments', false, false, true),
  walkway: k('walkway', 'walkways', false, true, false, true),
  handrail: k('handrail', 'handrails', true, true, false, true),
  end_handrail: k('end handrail', 'end handrails', false, false, true, true),
  stanchion: k('stanchion', 'stanchions', true, true, false, true),
  step: k('step', 'steps', false, true, true, true),
  battery_box: k('battery box', 'battery boxes', true, true, false),
  sand_box: k('sand box', 'sand boxes', true, true, false, true),
  mu_receptacle: k('MU receptacle', 'MU receptacles', false, true, true, true),
  uncoupling_lever: k('uncoupling lever', 'uncoupling levers', false, true, true, true),
  coupler: k('coupler', 'couplers', false, false, true, true),
  air_hose: k('air hose', 'air hoses', false, true, true, true),
  pilot: k('pilot', 'pilots', false, false, true, true),
  hand_brake: k('hand brake', 'hand brakes', false, false, false),
  hand_brake_chain: k('hand brake chain', 'hand brake chains', false, false, false, true),
  fuel_tank: k('fuel tank', 'fuel tanks', false, false, false, true),
  truck: k('truck', 'trucks', true, false, false, true),
  axle: k('axle', 'axles', true, false, false, true),
  wheel: k('wheel', 'wheels', true, true, false, true),
  traction_motor: k('traction motor', 'traction motors', true, false, false, true),
  air_reservoir: k('air reservoir', 'air reservoirs', true, false, false, true),
  front_marking: k('F marking', 'F markings', false, true, false),
} as const satisfies Record<string, PartKindSpec>;

export type PartKind = keyof typeof PART_KINDS;
export const PART_KIND_KEYS = Object.keys(PART_KINDS) as PartKind[];
export const isPartKind = (v: string): v is PartKind => Object.prototype.hasOwnProperty.call(PART_KINDS, v);

/** Parts within this distance of the centreline (inches) are treated as centred, not sided. */
export const CENTRE_TOLERANCE_IN = 6;
