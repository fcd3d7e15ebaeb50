import { defectTypeByKey } from '../../../../shared/defects/catalogue';
import type { HistoryItem } from '../api/history';
import { HOOD_WORDS, SERVICE_STATE_WORDS, formatDay } from './format';

export type HistoryGroup = 'finding' | 'inspection' | 'tag' | 'unit';

export interface HistoryEntry {
  group: HistoryGroup;
  /** What happened, in a few words ("Repair recorded"). */
  title: string;
  /** What it was about ("Front pilot — Pilot height above rail out of limit"). */
  detail: string;
  /** The finding or inspection the entry links to. */
  findingId?: string;
  inspectionId?: string;
  /** For a signed inspection: when it was started (its own "started" entry is folded into it). */
  startedAt?: string;
}

const FINDING_EVENTS: Record<string, string> = {
  created: 'Finding pinned',
  assigned: 'Finding assigned',
  repair_started: 'Repair started',
  repaired: 'Repair recorded',
  verified: 'Repair verified',
  sent_back: 'Repair sent back',
  voided: 'Finding voided',
  noted: 'Note added',
};

const DATE_FIELDS: Record<string, string> = {
  lastPeriodicOn: 'periodic inspection',
  lastAnnualOn: 'annual tests',
  lastHandBrakeOn: 'hand brake',
  lastMainReservoirOn: 'main reservoir test',
  lastCmCheckOn: '33-day check',
};

/** "Front pilot — pilot_height_out_of_limit: reason" with the defect key read as its name. */
function findingText(text: string): string {
  const cut = text.indexOf(' — ');
  if (cut < 0) return text;
  const label = text.slice(0, cut);
  const m = /^([a-z0-9_]+)(?::\s?([\s\S]*))?$/.exec(text.slice(cut + 3));
  if (!m) return text;
  const defect = defectTypeByKey(m[1])?.label ?? m[1].replace(/_/g, ' ');
  return `${label} — ${defect}${m[2] ? `: ${m[2]}` : ''}`;
}

const yesNo = (v: unknown) => (v ? 'on' : 'off');
const word = (v: unknown, words: Record<string, string>) => (typeof v === 'string' && v in words ? words[v] : String(v ?? '—'));

/** One changed field of a unit, in words. */
function changeWords(key: string, c: { from?: unknown; to?: unknown }): string {
  if (key === 'frontEnd') return `F moved from the ${word(c.from, HOOD_WORDS)} to the ${word(c.to, HOOD_WORDS)}`;
  if (key === 'serviceState') return `${word(c.from, SERVICE_STATE_WORDS)} → ${word(c.to, SERVICE_STATE_WORDS)}`;
  if (key === 'yardId') return 'Yard changed';
  if (key === 'conditionMonitoring') return `On-board condition monitoring ${yesNo(c.to)}`;
  if (key === 'humpStencilled') return `Hump-service stencil ${yesNo(c.to)}`;
  if (key in DATE_FIELDS) return `Last ${DATE_FIELDS[key]} set to ${formatDay(typeof c.to === 'string' ? c.to : null)}`;
  return key;
}

function unitChange(text: string): HistoryEntry {
  const cut = text.indexOf(': ');
  const action = cut < 0 ? text : text.slice(0, cut);
  let changed: Record<string, { from?: unknown; to?: unknown }> = {};
  try {
    changed = cut < 0 ? {} : (JSON.parse(text.slice(cut + 2)) ?? {});
  } catch {
    changed = {};
  }
  const title = action === 'unit_front_end_changed' ? 'F end changed' : action === 'unit_date_added' ? 'Dated item added' : 'Unit record changed';
  const parts = Object.entries(changed).map(([k, c]) => changeWords(k, c ?? {}));
  return { group: 'unit', title, detail: parts.join('; ') || 'Details in the audit log' };
}

/** Reads one entry of GET /api/units/:id/history into words and links. */
export function historyEntry(h: HistoryItem): HistoryEntry {
  if (h.kind.startsWith('finding_')) {
    const ev = h.kind.slice('finding_'.length);
    return { group: 'finding', title: FINDING_EVENTS[ev] ?? ev.replace(/_/g, ' '), detail: findingText(h.text), findingId: h.ref };
  }
  switch (h.kind) {
    case 'inspection_started':
    case 'inspection_signed': {
      const kind = h.text.split(' ')[0];
      const what = kind === 'periodic' ? 'Periodic inspection' : kind === 'daily' ? 'Daily inspection' : 'Inspection';
      return { group: 'inspection', title: `${what} ${h.kind === 'inspection_signed' ? 'signed' : 'started'}`, detail: '', inspectionId: h.ref };
    }
    case 'correction':
      return { group: 'inspection', title: 'Correction to a signed record', detail: h.text.replace(/^correction:\s*/, ''), inspectionId: h.ref };
    case 'tag_opened':
      return { group: 'tag', title: 'Non-complying tag opened', detail: '' };
    case 'tag_cleared':
      return { group: 'tag', title: 'Non-complying tag cleared', detail: '' };
    case 'unit_changed':
      return unitChange(h.text);
    default:
      return { group: 'unit', title: h.kind.replace(/_/g, ' '), detail: h.text };
  }
}

/**
 * The entries to list, newest first: a signed inspection absorbs its own "started" entry (a daily
 * every day would otherwise fill the page twice over); an unsigned one keeps its "started" entry.
 */
export function historyEntries(items: readonly HistoryItem[]): { item: HistoryItem; entry: HistoryEntry }[] {
  const started = new Map<string, string>();
  for (const h of items) if (h.kind === 'inspection_started') started.set(h.ref, h.at);
  const signed = new Set(items.filter((h) => h.kind === 'inspection_signed').map((h) => h.ref));
  return items
    .filter((h) => !(h.kind === 'inspection_started' && signed.has(h.ref)))
    .map((item) => {
      const entry = historyEntry(item);
      if (item.kind === 'inspection_signed' && started.has(item.ref)) entry.startedAt = started.get(item.ref);
      return { item, entry };
    });
}
