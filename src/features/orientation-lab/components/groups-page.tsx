import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { CreateGroupBody, type GroupRow } from '../../../../shared/api/lab';
import { ROLE_LABELS } from '../../../../shared/domain/roles';
import { ApiError } from '../../../lib/api-client';
import { useCreateGroup, useGroups, useLabPeople, useUpdateGroup } from '../api/groups';
import { fieldErrors } from '../lib/form-errors';

/** Training groups: who a quiz is shared with. */
export function GroupsPage() {
  const groups = useGroups();
  const [editing, setEditing] = useState<string | 'new' | null>(null);
  return (
    <div className="max-w-4xl space-y-5">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="text-3xl font-bold">Training groups</h1>
        <Link to="/lab" className="btn ml-auto">
          Back to the lab
        </Link>
        {editing !== 'new' && (
          <button type="button" className="btn-primary" onClick={() => setEditing('new')}>
            New group
          </button>
        )}
      </div>
      {editing === 'new' && <GroupForm onDone={() => setEditing(null)} />}
      {groups.isPending && <p>Loading…</p>}
      {groups.isError && <p role="alert">{groups.error.message}</p>}
      {groups.data?.items.length === 0 && editing !== 'new' && <p className="text-graphite-2">No groups yet.</p>}
      <ul className="space-y-3">
        {groups.data?.items.map((g) =>
          editing === g.id ? (
            <li key={g.id}>
              <GroupForm group={g} onDone={() => setEditing(null)} />
            </li>
          ) : (
            <li key={g.id} className="card flex flex-wrap items-start gap-3 p-4">
              <div className="min-w-0 flex-1">
                <p className="text-xl font-bold">{g.name}</p>
                <p className="text-base text-graphite-2">{g.members.length ? g.members.map((m) => m.name).join(', ') : 'Nobody yet'}</p>
              </div>
              <button type="button" className="btn" onClick={() => setEditing(g.id)} aria-label={`Change ${g.name}`}>
                Change
              </button>
            </li>
          ),
        )}
      </ul>
    </div>
  );
}

function GroupForm({ group, onDone }: { group?: GroupRow; onDone(): void }) {
  const people = useLabPeople();
  const create = useCreateGroup();
  const update = useUpdateGroup();
  const [name, setName] = useState(group?.name ?? '');
  const [members, setMembers] = useState<string[]>(group?.members.map((m) => m.id) ?? []);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | null>(null);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const parsed = CreateGroupBody.safeParse({ name, memberIds: members });
    if (!parsed.success) return void setErrors(fieldErrors(parsed.error));
    const onError = (err: unknown) => {
      setErrors(fieldErrors(err));
      setMessage(err instanceof ApiError ? err.message : 'The group could not be saved');
    };
    if (group) update.mutate({ id: group.id, ...parsed.data }, { onSuccess: onDone, onError });
    else create.mutate(parsed.data, { onSuccess: onDone, onError });
  };

  return (
    <form onSubmit={submit} noValidate className="card space-y-3 p-4" aria-label={group ? `Change ${group.name}` : 'New group'}>
      <div>
        <label htmlFor={`group-name-${group?.id ?? 'new'}`} className="label">
          Group name
        </label>
        <input id={`group-name-${group?.id ?? 'new'}`} className="field" value={name} onChange={(e) => setName(e.target.value)} aria-invalid={!!errors.name} />
        {errors.name && <p className="field-error">{errors.name}</p>}
      </div>
      <fieldset>
        <legend className="label">Members</legend>
        {people.isPending && <p>Loading people…</p>}
        <div className="grid gap-1 sm:grid-cols-2">
          {people.data?.items.map((p) => (
            <label key={p.id} className="flex min-h-12 items-center gap-2 text-base">
              <input
                type="checkbox"
                className="size-5"
                checked={members.includes(p.id)}
                onChange={(e) => setMembers((m) => (e.target.checked ? [...m, p.id] : m.filter((x) => x !== p.id)))}
              />
              <span>
                {p.name} <span className="text-graphite-2">· {ROLE_LABELS[p.role]}{p.yardName ? `, ${p.yardName}` : ''}</span>
              </span>
            </label>
          ))}
        </div>
        {errors.memberIds && <p className="field-error">{errors.memberIds}</p>}
      </fieldset>
      {message && (
        <p role="alert" className="field-error">
          {message}
        </p>
      )}
      <div className="flex gap-3">
        <button type="submit" className="btn-primary" disabled={create.isPending || update.isPending}>
          {group ? 'Save the group' : 'Create the group'}
        </button>
        <button type="button" className="btn" onClick={onDone}>
          Cancel
        </button>
      </div>
    </form>
  );
}
