import { lazy, Suspense, type ReactNode } from 'react';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import { Page } from '../../components/page';
import { SectionNav } from '../../components/section-nav';
import { ErrorState, LoadingState } from '../../components/states';
import { TankAlertsSection } from '../../features/alerts/components/tank-alerts-section';
import { can, useMe } from '../../lib/auth';
import { KeyReadings } from '../../features/readings/components/key-readings';
import { useTank } from '../../features/tanks/api/get-tank';
import { TankAtAGlance } from '../../features/tanks/components/tank-at-a-glance';
import { NextVisitLine } from '../../features/visits/components/next-visit-card';
import { TankMessagesLink } from '../../features/conversations/components/tank-messages-link';
import { TankUrgentVisitAction } from '../../features/urgent/components/request-urgent-visit-action';

/*
 * The summary is the first screen and loads with the page; every other section, and the care
 * tips under the summary (Markdown), load when shown, so the first visit downloads only what the
 * summary draws (tests/web/bundle-budget.test.ts).
 */
const TankReadingsSection = lazy(async () => ({
  default: (await import('../../features/readings/components/tank-readings-section')).TankReadingsSection,
}));
const TankVisitsSection = lazy(async () => ({
  default: (await import('../../features/visits/components/tank-visits-section')).TankVisitsSection,
}));
const TankTimeline = lazy(async () => ({
  default: (await import('../../features/timeline/components/tank-timeline')).TankTimeline,
}));
const TankLivestock = lazy(async () => ({
  default: (await import('../../features/livestock/components/tank-livestock')).TankLivestock,
}));
const TankEquipment = lazy(async () => ({
  default: (await import('../../features/equipment/components/tank-equipment')).TankEquipment,
}));
const TankOverview = lazy(async () => ({
  default: (await import('../../features/tanks/components/tank-overview')).TankOverview,
}));
const TankTipsFeed = lazy(async () => ({
  default: (await import('../../features/care-tips/components/tip-feed')).TankTipsFeed,
}));

const actionClass =
  'inline-flex min-h-11 items-center rounded-lg border border-ink-300 bg-white px-4 font-bold text-ink-900 no-underline hover:bg-ink-50';

function Section({
  id,
  title,
  description,
  children,
}: {
  id: string;
  title: string;
  description?: string;
  children: ReactNode;
}) {
  return (
    <section aria-labelledby={id}>
      <h2 id={id} className="text-xl font-bold text-ink-900">
        {title}
      </h2>
      {description && <p className="mt-1 text-sm text-ink-700">{description}</p>}
      <div className="mt-3">{children}</div>
    </section>
  );
}

const sections = [
  { key: 'summary', label: 'Summary' },
  { key: 'readings', label: 'Readings and charts' },
  { key: 'visits', label: 'Visits' },
  { key: 'timeline', label: 'Timeline' },
  { key: 'livestock', label: 'Livestock' },
  { key: 'equipment', label: 'Equipment' },
  { key: 'about', label: 'About the tank' },
] as const;
type SectionKey = (typeof sections)[number]['key'];

const isSection = (value: string | null): value is SectionKey => sections.some((s) => s.key === value);

/*
 * Links carry a parameter and an id (a notification's). They are checked without zod, whose
 * enums this page would otherwise load with it (the catalogue is loaded for the readings anyway).
 */
const isParameterKey = (value: string | null): value is ParameterKey =>
  value !== null && Object.hasOwn(parameterCatalogue, value);
const idPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const idParam = (value: string | null) => (value && idPattern.test(value) ? value : null);

/**
 * A tank's page: a summary that answers "is my tank OK, and what do I do?" on the first screen
 * of a phone, and the rest one tap away in sections that live in the address (`?section=`), so
 * the back button and a shared link both land where they should.
 */
export function TankRoute() {
  const { tankId = '' } = useParams();
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const tank = useTank(tankId);
  const { data: me } = useMe();
  const isStaff = can(me, 'tanks:write');
  const asked = params.get('section');
  const section: SectionKey = isSection(asked) ? asked : 'summary';
  const askedParameter = params.get('parameter');
  const chosenParameter = isParameterKey(askedParameter) ? askedParameter : undefined;
  // A notification links to one visit's report: ?section=visits&visit=<id>.
  const visitId = idParam(params.get('visit'));
  // A care tip's notification links to it on the timeline: ?section=timeline&tip=<id>.
  const tipId = idParam(params.get('tip'));
  const sectionHref = (key: SectionKey) =>
    key === 'summary' ? `/tanks/${tankId}` : `/tanks/${tankId}?section=${key}`;

  if (tank.isPending) {
    return (
      <Page title="Tank">
        <LoadingState label="Loading the tank…" />
      </Page>
    );
  }
  if (tank.isError) {
    return (
      <Page title="Tank">
        <ErrorState error={tank.error} what="this tank" onRetry={() => void tank.refetch()} />
      </Page>
    );
  }
  const timeZone = tank.data.effectiveTimeZone;
  const openChart = (parameter: ParameterKey) =>
    void navigate(`/tanks/${tankId}?section=readings&parameter=${parameter}`);
  return (
    <Page
      title={tank.data.name}
      description={tank.data.siteLabel}
      actions={
        <>
          <TankUrgentVisitAction tankId={tankId} />
          <TankMessagesLink tankId={tankId} />
          {isStaff && (
            <Link to={`/console/tanks/${tankId}/edit`} className={actionClass}>
              Edit tank
            </Link>
          )}
        </>
      }
    >
      <NextVisitLine tankId={tankId} href={sectionHref('visits')} />
      <SectionNav
        label="Tank sections"
        current={section}
        sections={sections.map(({ key, label }) => ({ key, label, to: sectionHref(key) }))}
      />
      <div className="mt-5">
        {section === 'summary' && (
          <div className="grid gap-6">
            <TankAtAGlance tank={tank.data} />
            <TankAlertsSection tankId={tankId} recentResolved={3} />
            <KeyReadings
              tankId={tankId}
              onOpen={openChart}
              more={
                <Link
                  to={sectionHref('readings')}
                  className="inline-flex min-h-11 items-center font-bold text-brine-700"
                >
                  All readings and charts
                </Link>
              }
            />
            <Suspense fallback={<LoadingState label="Loading care tips…" />}>
              <TankTipsFeed tankId={tankId} companyName={tank.data.company.name} />
            </Suspense>
          </div>
        )}
        {section === 'readings' && (
          <Suspense fallback={<LoadingState label="Loading readings…" />}>
            <TankReadingsSection
              key={chosenParameter ?? 'first'}
              tankId={tankId}
              canEdit={isStaff}
              initialParameter={chosenParameter}
            />
          </Suspense>
        )}
        {section === 'visits' && (
          <Section
            id="visits-title"
            title="Visits"
            description="What each visit did, and when the next one is."
          >
            <Suspense fallback={<LoadingState label="Loading visits…" />}>
              <TankVisitsSection
                tank={{
                  id: tankId,
                  name: tank.data.name,
                  siteLabel: tank.data.siteLabel,
                  companyName: tank.data.company.name,
                }}
                isStaff={isStaff}
                visitId={visitId}
                hrefFor={(visitId) => `${sectionHref('visits')}&visit=${visitId}`}
              />
            </Suspense>
          </Section>
        )}
        {section === 'timeline' && (
          <Section
            id="timeline-title"
            title="Timeline"
            description="Everything that happened to this tank, newest first: visit reports, livestock changes, alerts and care tips."
          >
            <Suspense fallback={<LoadingState label="Loading the timeline…" />}>
              <TankTimeline tankId={tankId} tipId={tipId} />
            </Suspense>
          </Section>
        )}
        {section === 'livestock' && (
          <Section
            id="livestock-title"
            title="Livestock"
            description="What lives in the tank and how each is doing."
          >
            {isStaff && (
              <p className="mb-3">
                <Link to={`/console/tanks/${tankId}/livestock`} className={actionClass}>
                  Manage livestock
                </Link>
              </p>
            )}
            <Suspense fallback={<LoadingState label="Loading livestock…" />}>
              <TankLivestock tankId={tankId} timeZone={timeZone} />
            </Suspense>
          </Section>
        )}
        {section === 'equipment' && (
          <Section
            id="equipment-title"
            title="Equipment and power boards"
            description="Where everything is plugged in, so you can switch off the right outlet."
          >
            {isStaff && (
              <p className="mb-3">
                <Link to={`/console/tanks/${tankId}/equipment`} className={actionClass}>
                  Manage equipment
                </Link>
              </p>
            )}
            <Suspense fallback={<LoadingState label="Loading equipment…" />}>
              <TankEquipment tankId={tankId} timeZone={timeZone} />
            </Suspense>
          </Section>
        )}
        {section === 'about' && (
          <Suspense fallback={<LoadingState label="Loading the tank's details…" />}>
            <TankOverview tank={tank.data} />
          </Suspense>
        )}
      </div>
    </Page>
  );
}
