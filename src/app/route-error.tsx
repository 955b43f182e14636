import { isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { NotFoundPage } from '../routes/not-found';

/** What a page shows when it throws while rendering, instead of a blank screen. */
export function RouteError() {
  const error = useRouteError();
  if (isRouteErrorResponse(error) && error.status === 404) return <NotFoundPage />;
  return (
    <div role="alert" className="mx-auto max-w-md px-4 py-16 text-center">
      <h1 className="text-2xl font-semibold">This page ran into a problem</h1>
      <p className="mt-2 text-sm text-muted">Reload to try again. If it keeps happening, tell an admin what you were doing.</p>
      <button type="button" onClick={() => window.location.reload()} className="mt-6 rounded-md bg-accent px-3 py-1.5 text-sm font-medium text-accent-ink">
        Reload
      </button>
    </div>
  );
}
