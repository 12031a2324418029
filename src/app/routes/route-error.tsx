import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';

/** Shown when a page fails to load or render; the rest of the app keeps working. */
export function RouteError() {
  const error = useRouteError();
  const message = isRouteErrorResponse(error) ? `${error.status} ${error.statusText}` : error instanceof Error ? error.message : 'Unknown error';
  return (
    <div className="mx-auto max-w-lg p-8 text-center font-sans text-ink">
      <h1 className="font-serif text-2xl font-bold">This page hit a snag</h1>
      <p className="mt-2 text-ink-soft">Nothing you saved is lost. Reload the page, or go back to the start.</p>
      <p className="mt-3 text-xs text-ink-muted">{message}</p>
      <p className="mt-5">
        <Link to="/">Start page</Link>
      </p>
    </div>
  );
}
