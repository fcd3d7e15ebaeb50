import type { RouteDef } from '../../http/routes';
import type { Deps } from '../../deps';

export function outboxRoutes(_deps: Deps): RouteDef[] {
  return [];
}
