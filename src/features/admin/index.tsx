import { zodResolver } from '@hookform/resolvers/zod';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { NavLink, Route, Routes } from 'react-router-dom';
import { SettingsBody, type Settings } from '../../../shared/api/settings';
import { api, ApiError } from '../../lib/api-client';

type AuditRow = { id: number; at: string; action: string; entity: string; entityId: string | null; ip: string | null; actor: string | null; details: unknown };

const settingsQuery = () => queryOptions({ queryKey: ['settings'], queryFn: () => api<Settings>('/settings') });
const auditQuery = (before?: number) => queryOptions({ queryKey: ['audit', before ?? null], queryFn: () => api<{ items: AuditRow[] }>(`/audit?limit=100${before ? `&before=${before}` : ''}`) });

/** Railroad settings and the audit log (admin). */
export default function AdminScreen() {
  return (
    <div className="space-y-4">
      <h1 className="text-3xl font-bold">Railroad</h1>
      <nav aria-label="Railroad sections" className="flex gap-2">
        <NavLink end to="/railroad" className={({ isActive }) => (isActive ? 'btn-primary' : 'btn')}>Settings</NavLink>
        <NavLink to="/railroad/audit" className={({ isActive }) => (isActive ? 'btn-primary' : 'btn')}>Audit log</NavLink>
      </nav>
      <Routes>
        <Route index element={<SettingsForm />} />
        <Route path="audit" element={<AuditLog />} />
      </Routes>
    </div>
  );
}

function SettingsForm() {
  const q = useQuery(settingsQuery());
  const qc = useQueryClient();
  const save = useMutation({
    mutationFn: (body: Partial<Settings>) => api<Settings>('/settings', { method: 'PATCH', body }),
    onSuccess: (s) => qc.setQueryData(settingsQuery().queryKey, s),
  });
  const form = useForm<Settings>({ resolver: zodResolver(SettingsBody.required()) as never });
  useEffect(() => {
    if (q.data) form.reset(q.data);
  }, [q.data, form]);
  const e = form.formState.errors;
  const err = save.error instanceof ApiError ? save.error : null;
  if (q.isPending) return <p>Loading…</p>;
  return (
    <form className="card grid max-w-2xl gap-3 p-4 sm:grid-cols-2" noValidate onSubmit={form.handleSubmit((v) => save.mutate(v))} aria-label="Railroad settings">
      {(
        [
          ['name', 'Railroad name', 'text'],
          ['reportingMark', 'Reporting mark', 'text'],
          ['timeZone', 'Time zone (IANA, e.g. America/Chicago)', 'text'],
          ['digestHour', 'Daily digest hour (0–23, local)', 'number'],
          ['repeatWindowDays', 'Repeat window (days)', 'number'],
        ] as const
      ).map(([k, label, type]) => (
        <div key={k}>
          <label className="label" htmlFor={`s-${k}`}>{label}</label>
          <input id={`s-${k}`} className="field" type={type} {...form.register(k, type === 'number' ? { valueAsNumber: true } : {})} />
          {(e[k] || err?.fields?.[k]) && <p className="field-error">{e[k]?.message ?? err?.fields?.[k]}</p>}
        </div>
      ))}
      <div className="flex items-end">
        <button className="btn-primary" disabled={save.isPending}>Save settings</button>
      </div>
      {save.isSuccess && <p role="status" className="font-bold text-ok sm:col-span-2">Saved.</p>}
      <p className="text-graphite-2 sm:col-span-2">Day counts on the due board and in every check are calendar days in this time zone.</p>
    </form>
  );
}

function AuditLog() {
  const q = useQuery(auditQuery());
  if (q.isPending) return <p>Loading…</p>;
  if (q.isError) return <p role="alert">Could not load the audit log.</p>;
  if (!q.data.items.length) return <p>No entries yet.</p>;
  return (
    <div className="overflow-x-auto">
      <p className="mb-2 text-graphite-2">Every write, newest first. Entries cannot be changed or removed by anyone.</p>
      <table className="w-full border-collapse text-left text-base">
        <thead>
          <tr className="border-b-2 border-graphite">
            {['When (UTC)', 'Who', 'What', 'On', 'From'].map((h) => (
              <th key={h} className="p-2 uppercase tracking-wider">{h}</th>
            ))}
          </tr>
        </thead>
        <tbody>
          {q.data.items.map((r) => (
            <tr key={r.id} className="border-b border-rule align-top">
              <td className="p-2 whitespace-nowrap">{new Date(r.at).toISOString().replace('T', ' ').slice(0, 19)}</td>
              <td className="p-2">{r.actor ?? '—'}</td>
              <td className="p-2 font-bold">{r.action.replace(/_/g, ' ')}</td>
              <td className="p-2">{r.entity}{r.entityId ? ` ${r.entityId.slice(0, 8)}` : ''}</td>
              <td className="p-2">{r.ip ?? ''}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
