import { useSyncExternalStore } from 'react';

const subscribe = (cb: () => void) => {
  window.addEventListener('online', cb);
  window.addEventListener('offline', cb);
  return () => {
    window.removeEventListener('online', cb);
    window.removeEventListener('offline', cb);
  };
};

export const useOnline = () => useSyncExternalStore(subscribe, () => navigator.onLine, () => true);

/** Shown while the device says it has no connection, or after a request could not reach the server. */
export function OfflineBanner({ failed = false }: { failed?: boolean }) {
  const online = useOnline();
  if (online && !failed) return null;
  return (
    <div role="status" className="no-print rounded-md border-2 border-graphite bg-graphite p-3 text-lg font-bold text-paper">
      No connection. Findings you pin and parts you pass or mark n.a. are kept on this device and sent, in order, when the connection
      returns; signing waits for it.
    </div>
  );
}
