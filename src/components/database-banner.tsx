import { useDatabaseDownSince } from '../lib/database-status';

/** Shown on every page while the server cannot reach its database; it goes away by itself. */
export function DatabaseBanner() {
  const since = useDatabaseDownSince();
  if (since === null) return null;
  return (
    <div role="alert" data-testid="database-banner" className="border-b-2 border-danger bg-danger-soft px-4 py-2 text-sm text-ink">
      <p>
        <strong className="font-semibold">Parapet cannot reach its database</strong> (since {new Date(since).toLocaleTimeString()}). What you see here is not
        being updated and changes cannot be saved. Nodes keep their reports and send them again; Parapet reconnects by itself and this notice goes away when it
        does.
      </p>
    </div>
  );
}
