import type { RouteDef } from '../../http/routes';
import type { Deps } from '../../deps';

export function walkaroundRoutes(_deps: Deps): RouteDef[] {
  return [];
}
