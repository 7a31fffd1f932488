import { Link } from 'react-router';

export function NotFoundRoute() {
  return (
    <section className="mx-auto max-w-xl px-4 py-16 text-center" aria-labelledby="not-found-title">
      <p className="text-sm font-bold uppercase tracking-wider text-brine-700">404</p>
      <h1 id="not-found-title" className="mt-2 text-2xl font-bold text-ink-900">
        Nothing lives at this address
      </h1>
      <p className="mt-3 text-ink-700">The link may be old or mistyped.</p>
      <Link
        to="/"
        className="mt-6 inline-block rounded-lg bg-brine-700 px-4 py-2.5 font-bold text-white no-underline hover:bg-brine-600"
      >
        Back to Brinewatch
      </Link>
    </section>
  );
}
