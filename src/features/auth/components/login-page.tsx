import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { Navigate, useLocation } from 'react-router-dom';
import { LoginBody } from '../../../../shared/api/auth';
import { ApiError } from '../../../lib/api-client';
import { Logo } from '../../../components/logo';
import { useLogin, useMe } from '../api/me';

export function LoginPage() {
  const me = useMe();
  const login = useLogin();
  const location = useLocation();
  const form = useForm<LoginBody>({ resolver: zodResolver(LoginBody), defaultValues: { email: '', password: '' } });
  const from = (location.state as { from?: string } | null)?.from ?? '/';
  if (me.data) return <Navigate to={from} replace />;
  const err = login.error instanceof ApiError ? login.error : null;
  return (
    <main className="flex min-h-full items-center justify-center p-4">
      <form
        className="card w-full max-w-md space-y-5 p-6 shadow-sm"
        onSubmit={form.handleSubmit((v) => login.mutate(v))}
        noValidate
        aria-labelledby="signin-title"
      >
        <div className="flex items-center gap-3">
          <Logo />
          <div>
            <h1 id="signin-title" className="text-3xl font-bold">Hoodline</h1>
            <p className="text-graphite-2">Locomotive inspection on the drawing</p>
          </div>
        </div>
        <div>
          <label className="label" htmlFor="email">E-mail</label>
          <input id="email" className="field" type="email" autoComplete="username" inputMode="email" {...form.register('email')} />
          {form.formState.errors.email && <p className="field-error">{form.formState.errors.email.message}</p>}
        </div>
        <div>
          <label className="label" htmlFor="password">Password</label>
          <input id="password" className="field" type="password" autoComplete="current-password" {...form.register('password')} />
          {form.formState.errors.password && <p className="field-error">{form.formState.errors.password.message}</p>}
        </div>
        {err && (
          <p role="alert" className="rounded-md border-2 border-federal p-3 font-bold text-federal">
            {err.message}
          </p>
        )}
        {login.error && !err && <p role="alert" className="field-error">Could not reach Hoodline. Check the connection.</p>}
        <button className="btn-primary w-full" type="submit" disabled={login.isPending}>
          {login.isPending ? 'Signing in…' : 'Sign in'}
        </button>
      </form>
    </main>
  );
}
