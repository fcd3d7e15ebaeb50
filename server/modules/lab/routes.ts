import type { RouteDef } from '../../http/routes';
import type { Deps } from '../../deps';

export function labRoutes(_deps: Deps): RouteDef[] {
  return [];
}
