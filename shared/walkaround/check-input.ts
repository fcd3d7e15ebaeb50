/** A reading as entered on a finding: a length (with its nominal or adjoining value) or a date. */
export interface Reading {
  value?: number;
  unit?: 'in' | 'mm';
  nominal?: number;
  adjoining?: number;
  lastDone?: string;
}

/**
 * The input of a defect's rule check from what the inspector entered and what the unit says. The form
 * runs it live and the server runs it when it stores, so both give the same answer. Null while there is
 * nothing to check yet.
 */
export function checkInputFor(
  defect: { check?: string; checkPreset?: Readonly<Record<string, string | boolean>> },
  r: Reading,
  ctx: { humpStencilled: boolean; today: string },
): Record<string, unknown> | null {
  const preset = defect.checkPreset ?? {};
  const has = r.value !== undefined;
  switch (defect.check) {
    case 'pilot_height':
      return has ? { value: r.value, unit: r.unit, service: ctx.humpStencilled ? 'hump_yard' : 'road', stencilled: ctx.humpStencilled, ...preset } : null;
    case 'chain_wear':
      return has ? { nominal: r.nominal, measured: r.value, unit: r.unit } : null;
    case 'wheel_flat':
      return has ? { length: r.value, ...(r.adjoining ? { adjoiningLength: r.adjoining } : {}), unit: r.unit, ...preset } : null;
    case 'flange_thickness':
    case 'rim_thickness':
    case 'tread_hollow':
      return has ? { value: r.value, unit: r.unit, ...preset } : null;
    case 'interval':
      return r.lastDone ? { ...preset, lastDone: r.lastDone, on: ctx.today } : null;
    case 'sanders':
      return r.lastDone ? { discovered: r.lastDone, on: ctx.today } : null;
    default:
      return null;
  }
}
