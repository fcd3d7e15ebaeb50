import { useQueryClient } from '@tanstack/react-query';
import { useId, useState } from 'react';
import type { Me } from '../../../../shared/api/auth';
import { SendBackBody, VoidBody } from '../../../../shared/api/repairs';
import { transition, type FindingAction } from '../../../../shared/repairs/transitions';
import { ApiError } from '../../../lib/api-client';
import { useFindingAction, type ActionBody, type ActionResult, type FindingDetail } from '../api/finding';
import { repairKeys } from '../api/queue';
import { ReasonForm, RepairForm } from './repair-form';

const ACTION_WORDS: Record<FindingAction, string> = {
  assign: 'Assign',
  repair: 'Record the repair',
  verify: 'Verify the repair',
  send_back: 'Send back',
  void: 'Void (entered in error)',
};

interface Props {
  finding: FindingDetail;
  me: Me;
  /** People the foreman can pick from. */
  people: { id: string; name: string }[];
  onRepaired: (photos: File[]) => void;
}

/** The actions the person's role and the finding's state allow, each sent with the version on screen. */
export function FindingActions({ finding, me, people, onRepaired }: Props) {
  const qc = useQueryClient();
  const act = useFindingAction(finding.id);
  const [open, setOpen] = useState<FindingAction | null>(null);
  const lastRepair = finding.events.find((e) => e.kind === 'repaired');
  const ownRepair = !!lastRepair && lastRepair.actor === me.name;
  const allowed = (['assign', 'repair', 'verify', 'send_back', 'void'] as const).filter((a) => transition(a, finding.state, me.role).ok);
  // A second pair of eyes: whoever recorded the repair does not verify it or send it back (the server refuses too).
  const shown = allowed.filter((a) => !(ownRepair && (a === 'verify' || a === 'send_back')));
  const err = act.error instanceof ApiError ? act.error : null;
  const stale = err?.code === 'stale';

  const send = (body: ActionBody, after?: (r: ActionResult) => void) =>
    act.mutate(body, {
      onSuccess: (r) => {
        setOpen(null);
        after?.(r);
      },
    });

  const reload = async () => {
    await qc.invalidateQueries({ queryKey: repairKeys.finding(finding.id) });
    act.reset();
  };

  if (!shown.length && !stale) {
    return (
      <p className="text-graphite-2">
        {ownRepair && allowed.length ? 'You recorded this repair, so someone else verifies it.' : finding.state === 'verified' || finding.state === 'voided' ? 'Nothing more to do: this finding is closed.' : 'Your role reads this finding; others act on it.'}
      </p>
    );
  }
  return (
    <div className="space-y-3">
      {stale && err && (
        <div role="alert" className="card space-y-2 border-federal p-3">
          <p className="font-bold">{err.message}</p>
          <button type="button" className="btn-primary" onClick={() => void reload()}>
            Reload
          </button>
        </div>
      )}
      {err && !stale && (
        <div role="alert" className="card border-federal p-3 font-bold text-federal">
          <p>{err.message}</p>
          {err.fields && (
            <ul>
              {Object.entries(err.fields).map(([k, v]) => (
                <li key={k}>{v}</li>
              ))}
            </ul>
          )}
        </div>
      )}
      {ownRepair && allowed.some((a) => a === 'verify') && <p className="text-graphite-2">You recorded this repair, so someone else verifies it.</p>}
      <div className="flex flex-wrap gap-2" role="group" aria-label="Actions">
        {shown.map((a) =>
          a === 'verify' ? (
            <button key={a} type="button" className="btn-primary" disabled={act.isPending || stale} onClick={() => send({ action: 'verify', version: finding.version })}>
              {ACTION_WORDS[a]}
            </button>
          ) : (
            <button
              key={a}
              type="button"
              className={a === 'void' ? 'btn-danger' : open === a ? 'btn-primary' : 'btn'}
              aria-expanded={open === a}
              disabled={stale}
              onClick={() => {
                act.reset();
                setOpen(open === a ? null : a);
              }}
            >
              {ACTION_WORDS[a]}
            </button>
          ),
        )}
      </div>
      {open === 'assign' && (
        <AssignForm
          people={people}
          current={finding.assignedTo ?? me.id}
          busy={act.isPending}
          onCancel={() => setOpen(null)}
          onSubmit={(assigneeId) => send({ action: 'assign', version: finding.version, assigneeId })}
        />
      )}
      {open === 'repair' && (
        <RepairForm busy={act.isPending} onCancel={() => setOpen(null)} onSubmit={(v, photos) => send({ action: 'repair', version: finding.version, ...v }, () => photos.length && onRepaired(photos))} />
      )}
      {open === 'send_back' && (
        <ReasonForm
          title="Send the repair back"
          submit="Send back"
          schema={SendBackBody.omit({ version: true })}
          busy={act.isPending}
          onCancel={() => setOpen(null)}
          onSubmit={(reason) => send({ action: 'send_back', version: finding.version, reason })}
        />
      )}
      {open === 'void' && (
        <ReasonForm
          title="Void the finding"
          submit="Void the finding"
          danger
          schema={VoidBody.omit({ version: true })}
          busy={act.isPending}
          onCancel={() => setOpen(null)}
          onSubmit={(reason) => send({ action: 'void', version: finding.version, reason })}
        />
      )}
    </div>
  );
}

function AssignForm({ people, current, busy, onSubmit, onCancel }: { people: { id: string; name: string }[]; current: string; busy: boolean; onSubmit: (id: string) => void; onCancel: () => void }) {
  const id = useId();
  const [who, setWho] = useState(people.some((p) => p.id === current) ? current : (people[0]?.id ?? ''));
  return (
    <form
      className="flex flex-wrap items-end gap-2"
      aria-label="Assign the finding"
      onSubmit={(e) => {
        e.preventDefault();
        if (who) onSubmit(who);
      }}
    >
      <div className="min-w-64">
        <label className="label" htmlFor={`${id}-who`}>
          Assign to
        </label>
        <select id={`${id}-who`} className="field" value={who} onChange={(e) => setWho(e.target.value)}>
          {people.map((p) => (
            <option key={p.id} value={p.id}>
              {p.name}
            </option>
          ))}
        </select>
      </div>
      <button type="submit" className="btn-primary" disabled={busy || !who}>
        Assign
      </button>
      <button type="button" className="btn" onClick={onCancel}>
        Cancel
      </button>
    </form>
  );
}
