import type { RouteDef } from '../../http/routes';
import type { Deps } from '../../deps';

export function repairsRoutes(_deps: Deps): RouteDef[] {
  return [];
}
