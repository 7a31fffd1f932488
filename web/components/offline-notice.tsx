import { useOnline } from '../lib/use-online';

/**
 * Says so when the device has no connection, so a page that cannot load its data is not mistaken
 * for a broken one. The live region is always there, so the change is announced.
 */
export function OfflineNotice() {
  const online = useOnline();
  return (
    <div role="status">
      {!online && (
        <p className="bg-sand-100 px-4 py-2 text-center text-sm font-bold text-ink-900">
          You are offline. Brinewatch will load new data when the connection is back.
        </p>
      )}
    </div>
  );
}
