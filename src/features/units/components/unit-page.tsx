import { useQueries, useQuery } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import type { ViewKey } from '../../../../shared/domain/frames';
import { can } from '../../../../shared/domain/roles';
import { OrientationLegend } from '../../drawing';
import { unitTypeLayoutQuery } from '../../drawing/api/get-unit-layout';
import { ApiError } from '../../../lib/api-client';
import { dueBoardQuery } from '../api/due';
import { findingQuery, openFindingsQuery, type FindingPinDetail } from '../api/findings';
import { historyQuery } from '../api/history';
import { meQuery } from '../api/me';
import { settingsQuery } from '../api/pickers';
import { tagQuery } from '../api/tag';
import { unitQuery } from '../api/unit';
import { DueItems } from './due-items';
import { HistoryList } from './history-list';
import { OpenFindings } from './open-findings';
import { TagCard } from './tag-card';
import { UnitDrawing } from './unit-drawing';
import { UnitHeader } from './unit-header';

const DRAWING_ID = 'unit-drawing';

/** One unit: its facts, its drawing with the open findings pinned, what is due, its tag and its history. */
export function UnitPage() {
  const { id = '' } = useParams();
  // A fresh page per unit: the selection, view and preview of one unit never carry over to the next.
  return <UnitPageFor key={id} id={id} />;
}

function UnitPageFor({ id }: { id: string }) {
  const unit = useQuery(unitQuery(id));
  const me = useQuery(meQuery());
  const settings = useQuery(settingsQuery());
  const due = useQuery(dueBoardQuery());
  const open = useQuery(openFindingsQuery(id));
  const history = useQuery(historyQuery(id));
  const tag = useQuery(tagQuery(id));
  const layout = useQuery({ ...unitTypeLayoutQuery(unit.data?.unitTypeKey ?? '', unit.data?.frontEnd ?? 'short_hood'), enabled: !!unit.data });
  const details = useQueries({
    queries: (open.data?.items ?? []).map((f) => findingQuery(f.id)),
    combine: (rs) => rs.map((r) => r.data).filter((d): d is FindingPinDetail => !!d),
  });
  const detailById = useMemo(() => new Map(details.map((d) => [d.id, d])), [details]);
  const [selectedPartId, setSelectedPartId] = useState<string | null>(null);
  const [view, setView] = useState<ViewKey>('plan');

  const tz = settings.data?.timeZone;
  const role = me.data?.role;
  const dueRow = due.data?.items.find((r) => r.unitId === id);

  if (unit.isPending) return <p className="text-xl">Loading the unit…</p>;
  if (unit.isError) {
    const missing = unit.error instanceof ApiError && (unit.error.status === 404 || unit.error.status === 400);
    return (
      <section role="alert" className="card max-w-xl space-y-3 p-6">
        <h1 className="text-2xl font-bold">{missing ? 'No such unit' : 'The unit could not be loaded'}</h1>
        <p>{missing ? 'This unit is not on the roster.' : unit.error.message}</p>
        <Link to="/units" className="btn">
          All units
        </Link>
      </section>
    );
  }
  const u = unit.data;

  return (
    <div className="space-y-4">
      <Link to="/units" className="inline-flex min-h-12 items-center font-bold underline underline-offset-4">
        ← All units
      </Link>
      <UnitHeader unit={u} dueState={dueRow?.state} />
      <UnitDrawing
        id={DRAWING_ID}
        unit={u}
        findings={details}
        canChangeFrontEnd={!!role && can(role, 'administer')}
        selectedPartId={selectedPartId}
        onSelectPart={setSelectedPartId}
        view={view}
        onViewChange={setView}
      />
      {/* Phones read top to bottom: tag, findings, what is due, then the long history; tablets put due and the legend beside them. */}
      <div className="grid gap-4 lg:grid-cols-3 lg:items-start">
        {tag.data?.open && (
          <div className="min-w-0 lg:col-span-2">
            <TagCard tag={tag.data} canOpenTagPage={!!role && can(role, 'inspect')} timeZone={tz} />
          </div>
        )}
        <div className="min-w-0 lg:col-span-2">
          {open.isError ? (
            <p role="alert" className="card p-3 font-bold text-federal">
              The open findings could not be loaded: {open.error.message}
            </p>
          ) : (
            <OpenFindings
              items={open.data?.items ?? []}
              total={open.data?.total}
              details={detailById}
              frontEnd={u.frontEnd}
              layout={layout.data}
              timeZone={tz}
              onShow={(f) => {
                setView(f.view);
                setSelectedPartId(f.partId);
                document.getElementById(DRAWING_ID)?.scrollIntoView?.({ block: 'start', behavior: 'smooth' });
              }}
            />
          )}
        </div>
        <div className="min-w-0 space-y-4 lg:col-start-3 lg:row-span-3 lg:row-start-1">
          <DueItems items={due.isError ? [] : dueRow?.items} on={due.data?.on} />
          <OrientationLegend frontEnd={u.frontEnd} />
        </div>
        <div className="min-w-0 lg:col-span-2">
          {history.isError ? (
            <p role="alert" className="card p-3 font-bold text-federal">
              The history could not be loaded: {history.error.message}
            </p>
          ) : history.data ? (
            <HistoryList items={history.data.items} canOpenRecords={!!role && can(role, 'inspect')} timeZone={tz} />
          ) : (
            <p className="card p-3">Loading the history…</p>
          )}
        </div>
      </div>
    </div>
  );
}
