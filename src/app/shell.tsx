import { Suspense, useEffect, useState } from 'react';
import { NavLink, Navigate, Outlet, useLocation } from 'react-router-dom';
import { ROLE_LABELS } from '../../shared/domain/roles';
import { ErrorBoundary } from '../components/error-boundary';
import { Logo } from '../components/logo';
import { useLogout, useMe } from '../features/auth/api/me';
import { screensFor } from './screens';

function useTheme() {
  const [dark, setDark] = useState(() => localStorage.getItem('hoodline.theme') === 'dark');
  useEffect(() => {
    document.documentElement.classList.toggle('dark', dark);
    localStorage.setItem('hoodline.theme', dark ? 'dark' : 'light');
  }, [dark]);
  return [dark, setDark] as const;
}

export function Shell() {
  const me = useMe();
  const logout = useLogout();
  const location = useLocation();
  const [dark, setDark] = useTheme();
  const [menu, setMenu] = useState(false);
  if (me.isPending) return <p className="p-6 text-xl">Loading…</p>;
  if (me.isError) return <p role="alert" className="p-6 text-xl">Hoodline cannot be reached. Check the connection and reload.</p>;
  if (!me.data) return <Navigate to="/sign-in" replace state={{ from: location.pathname }} />;
  const screens = screensFor(me.data.role);
  return (
    <div className="flex min-h-full flex-col">
      <header className="no-print sticky top-0 z-20 border-b-2 border-graphite bg-paper">
        <div className="flex items-center gap-3 px-3 py-2">
          <NavLink to="/" className="flex items-center gap-2 text-2xl font-bold" aria-label="Hoodline home">
            <Logo size={36} />
            <span className="hidden xl:inline">Hoodline</span>
          </NavLink>
          <button className="btn ml-auto lg:hidden" aria-expanded={menu} aria-controls="main-nav" onClick={() => setMenu((m) => !m)}>
            Menu
          </button>
          <nav id="main-nav" aria-label="Screens" className={`${menu ? 'flex' : 'hidden'} absolute top-full right-0 left-0 flex-col border-b-2 border-graphite bg-paper p-2 lg:static lg:flex lg:flex-row lg:border-0 lg:p-0`}>
            {screens.map((s) => (
              <NavLink
                key={s.path}
                to={s.path}
                onClick={() => setMenu(false)}
                className={({ isActive }) =>
                  `flex min-h-12 items-center rounded-md px-2.5 text-lg font-bold whitespace-nowrap ${isActive ? 'bg-graphite text-paper' : 'hover:bg-paper-2'}`
                }
              >
                {s.title}
              </NavLink>
            ))}
          </nav>
          {/* The signed-in person, always visible: it is also the way to the account page. */}
          <NavLink to="/account" className="btn px-3 leading-tight lg:ml-auto" title="Your account" data-testid="signed-in">
            <span className="flex flex-col items-start">
              <span>
                <span className="xl:hidden">{me.data.name.split(' ')[0]}</span>
                <span className="hidden xl:inline">{me.data.name}</span>
              </span>
              <span className="text-xs font-normal text-graphite-2">{ROLE_LABELS[me.data.role]}</span>
            </span>
          </NavLink>
          <button className="btn px-3 whitespace-nowrap" onClick={() => setDark((d) => !d)} aria-pressed={dark} title="Night colours" aria-label="Night colours">
            <span aria-hidden="true">{dark ? '☀' : '☾'}</span>
            <span className="hidden sm:inline" aria-hidden="true">{dark ? 'Day' : 'Night'}</span>
          </button>
          <button className="btn px-3 whitespace-nowrap" onClick={() => logout.mutate(false)}>
            Sign out
          </button>
        </div>
      </header>
      <main className="flex-1 p-3 sm:p-4">
        <ErrorBoundary key={location.pathname}>
          <Suspense fallback={<p className="text-xl">Loading…</p>}>
            <Outlet />
          </Suspense>
        </ErrorBoundary>
      </main>
    </div>
  );
}
