import { useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { startOfflineSync } from './sync';

/**
 * Sends what waits on this device (app start, connection back, page shown again, retry timer) on every
 * screen, not only the walkaround's: an inspector who walks off to the repair queue or a unit's page
 * still has their findings delivered. The app shell mounts it, in its own chunk, for people who inspect.
 */
export function OfflineSync() {
  const qc = useQueryClient();
  useEffect(() => startOfflineSync(qc), [qc]);
  return null;
}
export default OfflineSync;
