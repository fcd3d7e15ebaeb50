import type { RouteDef } from '../../http/routes';
import type { Deps } from '../../deps';

export function hotSpotsRoutes(_deps: Deps): RouteDef[] {
  return [];
}
