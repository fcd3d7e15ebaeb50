import { Link, Navigate } from 'react-router-dom';
import { useMe } from '../features/auth/api/me';
import { HOME_BY_ROLE } from './screens';

/** Each role lands on the screen it comes for. */
export function Home() {
  const me = useMe();
  if (!me.data) return null;
  return <Navigate to={HOME_BY_ROLE[me.data.role]} replace />;
}

export function NotFound() {
  return (
    <section className="card max-w-xl space-y-3 p-6">
      <h1 className="text-3xl font-bold">No such page</h1>
      <p>The address does not match any Hoodline screen.</p>
      <Link to="/" className="btn-primary">
        Go to your start screen
      </Link>
    </section>
  );
}
