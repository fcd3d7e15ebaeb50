import type { ReactNode } from 'react';
import type { UnitRow } from '../../../../shared/api/units';
import type { UnitDueState } from '../../../../shared/due/board';
import { SERVICE_STATE_WORDS, plural } from '../lib/format';
import { DueFlag, FrontEndWords, NonComplyingFlag } from './flags';

/** The unit's facts at the top of its page. */
export function UnitHeader({ unit, dueState }: { unit: UnitRow; dueState?: UnitDueState }) {
  const fact = (term: string, value: ReactNode) => (
    <div className="min-w-0 shrink-0">
      <dt className="label mb-0 max-sm:sr-only">{term}</dt>
      <dd className="text-lg">{value}</dd>
    </div>
  );
  return (
    <header className="space-y-1 sm:space-y-2">
      <div className="flex flex-wrap items-center gap-x-3 gap-y-2">
        <h1 className="text-3xl font-bold sm:text-4xl">{unit.roadNumber}</h1>
        {unit.nonComplying && <NonComplyingFlag large />}
        {dueState === 'overdue' && <DueFlag state="overdue" large />}
      </div>
      <dl className="flex flex-wrap gap-x-5 gap-y-1 sm:gap-x-8 sm:gap-y-2">
        <div className="min-w-0 basis-full sm:basis-auto">
          <dt className="label mb-0 max-sm:sr-only">Type</dt>
          <dd className="text-lg">{unit.unitTypeName}</dd>
        </div>
        {fact('F end', <FrontEndWords frontEnd={unit.frontEnd} />)}
        {fact('Yard', unit.yardName ?? 'None')}
        {fact('State', SERVICE_STATE_WORDS[unit.serviceState])}
        {fact('Open findings', unit.openFindings === 0 ? 'No open findings' : plural(unit.openFindings, 'open finding'))}
      </dl>
      {(unit.conditionMonitoring || unit.humpStencilled) && (
        <p className="text-graphite-2">
          {[unit.conditionMonitoring && 'On-board condition monitoring (periodic every 184 days, 49 CFR 229.23)', unit.humpStencilled && 'Stencilled for hump-yard service (49 CFR 229.123(b))']
            .filter(Boolean)
            .join(' · ')}
        </p>
      )}
    </header>
  );
}
