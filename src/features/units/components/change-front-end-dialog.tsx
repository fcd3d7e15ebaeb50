import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useId, useRef, useState, type KeyboardEvent } from 'react';
import type { UnitRow } from '../../../../shared/api/units';
import { flipFrontEnd } from '../../../../shared/orientation';
import { BlueSignalCaution } from '../../../components/blue-signal-caution';
import { ApiError } from '../../../lib/api-client';
import { unitKeys } from '../api/roster';
import { useChangeFrontEnd } from '../api/unit';
import { HOOD_WORDS } from '../lib/format';

const MIN_REASON = 3;

/**
 * The admin's confirmation before the F moves: what changes, a reason for the audit log, and a
 * stale answer (someone changed the unit since it was opened) offered as a reload.
 */
export function ChangeFrontEndDialog({
  unit,
  example,
  onClose,
  onChanged,
}: {
  unit: UnitRow;
  example: { before: string; after: string } | null;
  onClose(): void;
  onChanged(unit: UnitRow): void;
}) {
  const qc = useQueryClient();
  const id = useId();
  const change = useChangeFrontEnd(unit);
  const [reason, setReason] = useState('');
  const [touched, setTouched] = useState(false);
  const [reloaded, setReloaded] = useState<string | null>(null);
  const panel = useRef<HTMLDivElement>(null);
  const reasonRef = useRef<HTMLTextAreaElement>(null);
  const opener = useRef<Element | null>(null);
  const to = flipFrontEnd(unit.frontEnd);

  useEffect(() => {
    opener.current = document.activeElement;
    reasonRef.current?.focus();
    return () => {
      if (opener.current instanceof HTMLElement) opener.current.focus();
    };
  }, []);

  const err = change.error;
  const stale = err instanceof ApiError && err.status === 409;
  const reasonError = touched && reason.trim().length < MIN_REASON ? 'Say why the F end changes (it goes into the audit log)' : null;

  const submit = () => {
    setTouched(true);
    if (reason.trim().length < MIN_REASON || change.isPending) return;
    setReloaded(null);
    change.mutate({ version: unit.version, frontEnd: to, reason: reason.trim() }, { onSuccess: onChanged });
  };

  const reload = async () => {
    await qc.invalidateQueries({ queryKey: unitKeys.one(unit.id) });
    const fresh = qc.getQueryData<UnitRow>(unitKeys.one(unit.id));
    change.reset();
    if (fresh) setReloaded(`Reloaded: ${fresh.roadNumber} now carries its F on the ${HOOD_WORDS[fresh.frontEnd]} (version ${fresh.version}). Check before you change it.`);
  };

  // Keeps Tab inside the dialog and lets Escape close it, as a modal should.
  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    if (e.key === 'Escape') {
      e.preventDefault();
      onClose();
      return;
    }
    if (e.key !== 'Tab' || !panel.current) return;
    const els = [...panel.current.querySelectorAll<HTMLElement>('button, textarea, a[href], input, select')].filter((el) => !el.hasAttribute('disabled'));
    if (els.length === 0) return;
    const first = els[0], last = els[els.length - 1];
    if (e.shiftKey && document.activeElement === first) {
      e.preventDefault();
      last.focus();
    } else if (!e.shiftKey && document.activeElement === last) {
      e.preventDefault();
      first.focus();
    }
  };

  return (
    <div className="fixed inset-0 z-40 flex items-end justify-center bg-graphite/50 p-0 sm:items-center sm:p-4" onKeyDown={onKeyDown}>
      <div
        ref={panel}
        role="dialog"
        aria-modal="true"
        aria-labelledby={`${id}-title`}
        aria-describedby={`${id}-what`}
        className="card max-h-full w-full max-w-lg space-y-3 overflow-y-auto border-graphite p-4 shadow-xl"
      >
        <h2 id={`${id}-title`} className="text-2xl font-bold">
          Move the F of {unit.roadNumber} to the {HOOD_WORDS[to]}?
        </h2>
        <div id={`${id}-what`} className="space-y-2">
          <p>
            The record says the F is on the <strong>{HOOD_WORDS[unit.frontEnd]}</strong>. After the change the {HOOD_WORDS[to]} end is the front: front and rear,
            left and right, and every number on this unit change over at once.
            {example && (
              <>
                {' '}
                The part now called <strong>{example.before}</strong> will be <strong>{example.after}</strong>.
              </>
            )}
          </p>
          <p>Findings already pinned keep the names they were given; each says it was pinned under the other front end.</p>
          <p>Change it only after someone has seen the F stencil on the unit itself.</p>
        </div>
        <BlueSignalCaution compact />
        {reloaded && (
          <p role="status" className="rounded-md border-2 border-graphite p-2 font-bold">
            {reloaded}
          </p>
        )}
        <div>
          <label className="label" htmlFor={`${id}-reason`}>
            Reason (kept in the audit log)
          </label>
          <textarea
            ref={reasonRef}
            id={`${id}-reason`}
            className="field min-h-20 py-2"
            maxLength={500}
            value={reason}
            onChange={(e) => setReason(e.target.value)}
            onBlur={() => reason && setTouched(true)}
            aria-invalid={!!reasonError}
            aria-describedby={reasonError ? `${id}-reason-error` : undefined}
            placeholder="e.g. F stencil found on the long hood at the periodic inspection"
          />
          {reasonError && (
            <p id={`${id}-reason-error`} className="field-error">
              {reasonError}
            </p>
          )}
        </div>
        {err && (
          <div role="alert" className="space-y-2 rounded-md border-2 border-federal p-2 font-bold text-federal">
            <p>{stale ? err.message : `The change was not saved: ${err.message}`}</p>
            {stale && (
              <button type="button" className="btn" onClick={() => void reload()}>
                Reload the unit
              </button>
            )}
          </div>
        )}
        <div className="flex flex-wrap justify-end gap-2">
          <button type="button" className="btn" onClick={onClose}>
            Cancel
          </button>
          <button type="button" className="btn-primary" onClick={submit} disabled={change.isPending || stale}>
            {change.isPending ? 'Saving…' : `Move the F to the ${HOOD_WORDS[to]}`}
          </button>
        </div>
      </div>
    </div>
  );
}
