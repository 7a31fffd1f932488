import { Link } from 'react-router';
import { can, signInUrl, useMe } from '../../lib/auth';
import { ServiceStatus } from '../../features/health/components/service-status';
import { TankIllustration } from '../../features/landing/components/tank-illustration';

const promises = [
  {
    title: 'Is my tank OK?',
    body: 'Every tank gets one clear status — healthy, watch, alert or no recent data — worked out from its latest readings and limits.',
  },
  {
    title: 'Told early, calmly',
    body: 'When a reading crosses a limit you get one alert on your phone, with what it means and what to do first.',
  },
  {
    title: 'The story in the readings',
    body: 'Every reading your technician, your own tests or the tank’s device record, charted against the limits, with what lives in the tank and the water it needs.',
  },
  {
    title: 'Worked out for you',
    body: 'Calculators for salinity, alkalinity, free ammonia, dosing and water changes, with safety cautions where they matter.',
  },
];

const actionClass =
  'rounded-lg bg-brine-300 px-6 py-3 text-lg font-bold text-ink-950 no-underline hover:bg-brine-100';

function FrontDoorAction() {
  const { data: me, isPending } = useMe();
  if (isPending) return <span className="h-12 w-32 animate-pulse rounded-lg bg-ink-800" aria-hidden="true" />;
  if (me) {
    const staff = can(me, 'clients:read');
    return (
      <Link to={staff ? '/console' : '/tanks'} className={actionClass}>
        {staff ? 'Open the company console' : 'See my tanks'}
      </Link>
    );
  }
  return (
    <>
      <a href={signInUrl('/')} className={actionClass}>
        Sign in
      </a>
      <span className="text-sm text-ink-100">Your service company sends your invitation.</span>
    </>
  );
}

export function LandingRoute() {
  return (
    <>
      <section className="bg-ink-900 text-white">
        <div className="mx-auto grid max-w-6xl items-center gap-10 px-4 pb-14 pt-10 md:grid-cols-2 md:pt-16">
          <div>
            <h1 className="text-display font-bold">Your tank, looked after between visits.</h1>
            <p className="mt-4 max-w-prose text-lg text-ink-100">
              Brinewatch is your aquarium company&apos;s portal. See how your tank is doing, follow its
              readings, and hear about it the moment something looks wrong.
            </p>
            <div className="mt-8 flex flex-wrap items-center gap-4">
              <FrontDoorAction />
            </div>
          </div>
          <TankIllustration className="mx-auto w-full max-w-md" />
        </div>
      </section>
      <section aria-labelledby="promises-title" className="mx-auto max-w-6xl px-4 py-12">
        <h2 id="promises-title" className="text-2xl font-bold text-ink-900">
          What Brinewatch does for you
        </h2>
        <ul className="mt-6 grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          {promises.map((item) => (
            <li key={item.title} className="rounded-card bg-white p-5 shadow-card">
              <h3 className="font-bold text-ink-900">{item.title}</h3>
              <p className="mt-2 text-sm leading-relaxed text-ink-700">{item.body}</p>
            </li>
          ))}
        </ul>
      </section>
      <section aria-labelledby="status-title" className="mx-auto max-w-6xl px-4 pb-12">
        <h2 id="status-title" className="sr-only">
          Service status
        </h2>
        <ServiceStatus />
      </section>
    </>
  );
}
