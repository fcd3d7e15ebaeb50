import { Link } from 'react-router-dom';
import type { UnitRow } from '../../../../shared/api/units';
import type { UnitDueState } from '../../../../shared/due/board';
import { SERVICE_STATE_WORDS, plural } from '../lib/format';
import { DueFlag, FrontEndWords, NonComplyingFlag } from './flags';

export interface RosterListProps {
  units: readonly UnitRow[];
  /** The due board's state per unit id; missing while it loads. */
  due: ReadonlyMap<string, UnitDueState>;
}

function Findings({ n }: { n: number }) {
  return n === 0 ? <span className="text-graphite-2">None open</span> : <span className="font-bold">{plural(n, 'open finding')}</span>;
}

/** Tablet and desktop: one row per unit; the road number is the link, so Tab walks the roster a unit at a time. */
export function RosterTable({ units, due }: RosterListProps) {
  return (
    <div className="card hidden overflow-x-auto md:block">
      <table className="w-full border-collapse text-left text-base" aria-label="Units">
        <thead>
          <tr className="border-b-2 border-graphite text-sm tracking-wider uppercase">
            <th scope="col" className="px-3 py-2">Unit</th>
            <th scope="col" className="px-3 py-2">Type</th>
            <th scope="col" className="px-3 py-2">F end</th>
            <th scope="col" className="px-3 py-2">Yard</th>
            <th scope="col" className="px-3 py-2">State</th>
            <th scope="col" className="px-3 py-2">Findings</th>
          </tr>
        </thead>
        <tbody>
          {units.map((u) => (
            <tr key={u.id} data-unit={u.roadNumber} className={`border-b border-rule last:border-b-0 ${u.nonComplying ? 'bg-paper-2' : ''}`}>
              <th scope="row" className="px-3 py-1">
                <Link to={u.id} className="inline-flex min-h-12 items-center text-xl font-bold whitespace-nowrap underline decoration-2 underline-offset-4 hover:decoration-accent focus-visible:outline-3 focus-visible:outline-accent">
                  {u.roadNumber}
                </Link>
              </th>
              <td className="px-3 py-1">{u.unitTypeName}</td>
              <td className="px-3 py-1">
                <FrontEndWords frontEnd={u.frontEnd} />
              </td>
              <td className="px-3 py-1">{u.yardName ?? '—'}</td>
              <td className="px-3 py-1">
                <span className="flex flex-wrap items-center gap-1.5">
                  <span className="mr-1">{SERVICE_STATE_WORDS[u.serviceState]}</span>
                  {u.nonComplying && <NonComplyingFlag />}
                  {due.get(u.id) === 'overdue' && <DueFlag state="overdue" />}
                </span>
              </td>
              <td className="px-3 py-1">
                <Findings n={u.openFindings} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** Phone: one card per unit, the whole card a link and a large target. */
export function RosterCards({ units, due }: RosterListProps) {
  return (
    <ul className="space-y-2 md:hidden" aria-label="Units">
      {units.map((u) => (
        <li key={u.id} data-unit={u.roadNumber}>
          <Link
            to={u.id}
            className={`card block space-y-1.5 p-3 focus-visible:outline-3 focus-visible:outline-offset-2 focus-visible:outline-accent ${u.nonComplying ? 'border-federal' : ''}`}
          >
            <span className="flex flex-wrap items-center gap-2">
              <span className="mr-auto text-2xl font-bold">{u.roadNumber}</span>
              {u.nonComplying && <NonComplyingFlag />}
              {due.get(u.id) === 'overdue' && <DueFlag state="overdue" />}
            </span>
            <span className="block text-graphite-2">{u.unitTypeName}</span>
            <span className="flex flex-wrap items-center gap-x-4 gap-y-1">
              <FrontEndWords frontEnd={u.frontEnd} />
              <span>{u.yardName ?? 'No yard'}</span>
              <span>{SERVICE_STATE_WORDS[u.serviceState]}</span>
              <Findings n={u.openFindings} />
            </span>
          </Link>
        </li>
      ))}
    </ul>
  );
}
