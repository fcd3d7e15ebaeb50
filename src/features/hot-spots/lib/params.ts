import type { HotSpotsParams } from '../../../../shared/api/hot-spots';

/** Today's civil date on this device and the date `days` before it. */
export const civilToday = (): string => {
  const d = new Date();
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
};
export const civilDaysBefore = (date: string, days: number): string => new Date(Date.parse(`${date}T00:00:00Z`) - days * 86_400_000).toISOString().slice(0, 10);

const lists = ['defectTypes', 'weights', 'yards'] as const;

/** The filters as they sit in the address bar, so a view can be bookmarked and shared. */
export function filtersFromSearch(sp: URLSearchParams, defaultType: string): HotSpotsParams {
  const to = sp.get('to') ?? civilToday();
  const split = (k: string) => (sp.get(k) ?? '').split(',').filter(Boolean);
  return {
    unitType: sp.get('unitType') ?? defaultType,
    from: sp.get('from') ?? civilDaysBefore(to, 364),
    to,
    defectTypes: split('defectTypes'),
    weights: split('weights') as HotSpotsParams['weights'],
    yards: split('yards'),
  };
}

/** The API query string for a set of filters (lists comma-joined; empty lists left out). */
export function toQueryString(f: HotSpotsParams, extra: Record<string, string | undefined> = {}): string {
  const sp = new URLSearchParams({ unitType: f.unitType, from: f.from, to: f.to });
  for (const k of lists) if (f[k].length) sp.set(k, f[k].join(','));
  for (const [k, v] of Object.entries(extra)) if (v !== undefined) sp.set(k, v);
  return sp.toString();
}
