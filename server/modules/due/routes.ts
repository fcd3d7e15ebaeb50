import type { RouteDef } from '../../http/routes';
import type { Deps } from '../../deps';

export function dueRoutes(_deps: Deps): RouteDef[] {
  return [];
}
