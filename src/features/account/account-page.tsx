import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { ChangePasswordBody } from '../../../shared/api/auth';
import { ROLE_LABELS } from '../../../shared/domain/roles';
import { ApiError } from '../../lib/api-client';
import { useChangePassword, useLogout, useMe } from '../auth/api/me';

const Form = ChangePasswordBody.extend({ repeat: z.string() }).refine((v) => v.repeat === v.newPassword, { path: ['repeat'], message: 'The two new passwords differ' });
type FormValues = z.infer<typeof Form>;

export function AccountPage() {
  const me = useMe();
  const change = useChangePassword();
  const logout = useLogout();
  const form = useForm<FormValues>({ resolver: zodResolver(Form) });
  const e = form.formState.errors;
  const err = change.error instanceof ApiError ? change.error : null;
  if (!me.data) return null;
  return (
    <div className="max-w-xl space-y-4">
      <h1 className="text-3xl font-bold">Your account</h1>
      <p className="text-lg">
        {me.data.name} · {me.data.email} · {ROLE_LABELS[me.data.role]}
      </p>
      <form className="card space-y-3 p-4" noValidate aria-label="Change password" onSubmit={form.handleSubmit(({ repeat: _r, ...v }) => change.mutate(v, { onSuccess: () => form.reset() }))}>
        <h2 className="text-xl font-bold">Change password</h2>
        <div>
          <label className="label" htmlFor="pw-cur">Current password</label>
          <input id="pw-cur" className="field" type="password" autoComplete="current-password" {...form.register('currentPassword')} />
          {(e.currentPassword || err?.fields?.currentPassword) && <p className="field-error">{e.currentPassword?.message ?? err?.fields?.currentPassword}</p>}
        </div>
        <div>
          <label className="label" htmlFor="pw-new">New password (at least 10 characters)</label>
          <input id="pw-new" className="field" type="password" autoComplete="new-password" {...form.register('newPassword')} />
          {(e.newPassword || err?.fields?.newPassword) && <p className="field-error">{e.newPassword?.message ?? err?.fields?.newPassword}</p>}
        </div>
        <div>
          <label className="label" htmlFor="pw-rep">New password again</label>
          <input id="pw-rep" className="field" type="password" autoComplete="new-password" {...form.register('repeat')} />
          {e.repeat && <p className="field-error">{e.repeat.message}</p>}
        </div>
        <button className="btn-primary" disabled={change.isPending}>Change password</button>
        {change.isSuccess && <p role="status" className="font-bold text-ok">Password changed.</p>}
      </form>
      <section className="card space-y-2 p-4">
        <h2 className="text-xl font-bold">Signed in elsewhere?</h2>
        <p>Ends every session of yours, on every tablet and phone, including this one.</p>
        <button className="btn-danger" onClick={() => logout.mutate(true)}>Sign out everywhere</button>
      </section>
    </div>
  );
}
