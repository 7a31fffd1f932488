import { isRouteErrorResponse, Link, useRouteError } from 'react-router';
import { ApiError } from '../lib/api-client';

/** What a person sees when a page fails to load or render: plain words and a way on. */
export function RouteError() {
  const error = useRouteError();
  const notFound =
    (isRouteErrorResponse(error) && error.status === 404) ||
    (error instanceof ApiError && error.status === 404);
  return (
    <section className="mx-auto max-w-xl px-4 py-16 text-center" aria-labelledby="route-error-title">
      <h1 id="route-error-title" className="text-2xl font-bold text-ink-900">
        {notFound ? 'We could not find that page' : 'This page did not load'}
      </h1>
      <p className="mt-3 text-ink-700">
        {notFound
          ? 'It may have moved, or you may not have access to it.'
          : 'Something went wrong while showing this page. Reloading usually helps; if it keeps happening, message your service company.'}
      </p>
      <div className="mt-6 flex justify-center gap-3">
        <button
          type="button"
          onClick={() => window.location.reload()}
          className="rounded-lg bg-brine-700 px-4 py-2.5 font-bold text-white hover:bg-brine-600"
        >
          Reload
        </button>
        <Link
          to="/"
          className="rounded-lg border border-ink-300 px-4 py-2.5 font-bold text-ink-900 no-underline"
        >
          Go to the start
        </Link>
      </div>
    </section>
  );
}
