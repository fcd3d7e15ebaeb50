import type { ReactNode } from 'react';
import { can, type Capability } from '../../shared/domain/roles';
import { useMe } from '../features/auth/api/me';

/** Screens only for some roles; the server enforces the same rule on every API route. */
export function RequireCap({ cap, children }: { cap: Capability; children: ReactNode }) {
  const me = useMe();
  if (!me.data) return null;
  if (!can(me.data.role, cap)) {
    return (
      <section role="alert" className="card max-w-xl p-6">
        <h1 className="text-2xl font-bold">Not for your role</h1>
        <p>This screen is not part of your work in Hoodline. Ask an admin if you think it should be.</p>
      </section>
    );
  }
  return <>{children}</>;
}
