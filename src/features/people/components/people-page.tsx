import { zodResolver } from '@hookform/resolvers/zod';
import { createColumnHelper, flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { useForm } from 'react-hook-form';
import { CreatePersonBody, type PersonRow } from '../../../../shared/api/people';
import { ROLE_LABELS, ROLES, type Role } from '../../../../shared/domain/roles';
import { ApiError } from '../../../lib/api-client';
import { useCreatePerson, usePeople, useUnlockPerson, useUpdatePerson, useYards } from '../api/people';

const col = createColumnHelper<PersonRow>();

export function PeoplePage() {
  const people = usePeople();
  const yards = useYards();
  const update = useUpdatePerson();
  const unlock = useUnlockPerson();
  const [sorting, setSorting] = useState<SortingState>([{ id: 'name', desc: false }]);
  const yardName = (id: string | null) => yards.data?.items.find((y) => y.id === id)?.name ?? '—';
  const columns = useMemo(
    () => [
      col.accessor('name', { header: 'Name' }),
      col.accessor('email', { header: 'E-mail' }),
      col.accessor('role', {
        header: 'Role',
        cell: (c) => (
          <select
            aria-label={`Role of ${c.row.original.name}`}
            className="field min-w-36"
            value={c.getValue()}
            onChange={(e) => update.mutate({ id: c.row.original.id, version: c.row.original.version, role: e.target.value as Role })}
          >
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r]}
              </option>
            ))}
          </select>
        ),
      }),
      col.accessor('yardId', { header: 'Yard', cell: (c) => yardName(c.getValue()) }),
      col.accessor('active', {
        header: 'Account',
        cell: (c) => {
          const p = c.row.original;
          return (
            <div className="flex flex-wrap items-center gap-2">
              <span className={p.active ? 'font-bold text-ok' : 'font-bold text-graphite-2'}>{p.active ? 'Active' : 'Deactivated'}</span>
              {p.locked && <span className="font-bold text-federal">Locked</span>}
              <button className="btn min-h-10 px-3 text-base" onClick={() => update.mutate({ id: p.id, version: p.version, active: !p.active })}>
                {p.active ? 'Deactivate' : 'Reactivate'}
              </button>
              {p.locked && (
                <button className="btn min-h-10 px-3 text-base" onClick={() => unlock.mutate(p.id)}>
                  Unlock
                </button>
              )}
            </div>
          );
        },
      }),
    ],
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [yards.data],
  );
  const table = useReactTable({ data: people.data?.items ?? [], columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });
  const updErr = update.error instanceof ApiError ? update.error : null;
  return (
    <div className="space-y-4">
      <h1 className="text-3xl font-bold">People</h1>
      <p className="text-graphite-2">Accounts are never deleted: deactivate someone who leaves, and their records stay signed in their name.</p>
      {updErr && (
        <p role="alert" className="card border-federal p-3 font-bold text-federal">
          {updErr.message}
        </p>
      )}
      <NewPersonForm yards={yards.data?.items ?? []} />
      {people.isPending && <p>Loading people…</p>}
      {people.isError && <p role="alert">Could not load people.</p>}
      {people.data && (
        <div className="overflow-x-auto">
          <table className="w-full border-collapse text-left">
            <thead>
              {table.getHeaderGroups().map((hg) => (
                <tr key={hg.id} className="border-b-2 border-graphite">
                  {hg.headers.map((h) => (
                    <th key={h.id} className="p-2">
                      <button className="font-bold uppercase tracking-wider" onClick={h.column.getToggleSortingHandler()}>
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        {{ asc: ' ▲', desc: ' ▼' }[h.column.getIsSorted() as string] ?? ''}
                      </button>
                    </th>
                  ))}
                </tr>
              ))}
            </thead>
            <tbody>
              {table.getRowModel().rows.map((r) => (
                <tr key={r.id} className="border-b border-rule">
                  {r.getVisibleCells().map((c) => (
                    <td key={c.id} className="p-2">
                      {flexRender(c.column.columnDef.cell, c.getContext())}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}

function NewPersonForm({ yards }: { yards: { id: string; name: string }[] }) {
  const create = useCreatePerson();
  const [open, setOpen] = useState(false);
  const form = useForm<CreatePersonBody>({ resolver: zodResolver(CreatePersonBody), defaultValues: { role: 'inspector', yardId: null } });
  const err = create.error instanceof ApiError ? create.error : null;
  if (!open)
    return (
      <button className="btn-primary" onClick={() => setOpen(true)}>
        Add a person
      </button>
    );
  const e = form.formState.errors;
  return (
    <form
      className="card grid gap-3 p-4 sm:grid-cols-2"
      aria-label="Add a person"
      noValidate
      onSubmit={form.handleSubmit((v) =>
        create.mutate({ ...v, yardId: v.yardId || null }, { onSuccess: () => { form.reset(); setOpen(false); } }),
      )}
    >
      <div>
        <label className="label" htmlFor="np-name">Name</label>
        <input id="np-name" className="field" {...form.register('name')} />
        {e.name && <p className="field-error">{e.name.message}</p>}
      </div>
      <div>
        <label className="label" htmlFor="np-email">E-mail</label>
        <input id="np-email" className="field" type="email" {...form.register('email')} />
        {(e.email || err?.fields?.email) && <p className="field-error">{e.email?.message ?? err?.fields?.email}</p>}
      </div>
      <div>
        <label className="label" htmlFor="np-role">Role</label>
        <select id="np-role" className="field" {...form.register('role')}>
          {ROLES.map((r) => (
            <option key={r} value={r}>{ROLE_LABELS[r]}</option>
          ))}
        </select>
      </div>
      <div>
        <label className="label" htmlFor="np-yard">Yard</label>
        <select id="np-yard" className="field" {...form.register('yardId')}>
          <option value="">No yard</option>
          {yards.map((y) => (
            <option key={y.id} value={y.id}>{y.name}</option>
          ))}
        </select>
      </div>
      <div>
        <label className="label" htmlFor="np-pw">First password</label>
        <input id="np-pw" className="field" type="password" autoComplete="new-password" {...form.register('password')} />
        {e.password && <p className="field-error">{e.password.message}</p>}
      </div>
      <div className="flex items-end gap-2">
        <button className="btn-primary" type="submit" disabled={create.isPending}>Create</button>
        <button className="btn" type="button" onClick={() => setOpen(false)}>Cancel</button>
      </div>
      {err && !err.fields && <p role="alert" className="field-error sm:col-span-2">{err.message}</p>}
    </form>
  );
}
