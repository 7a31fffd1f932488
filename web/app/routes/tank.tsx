import { Link, useNavigate, useParams, useSearchParams } from 'react-router';
import { z } from 'zod';
import { parameterKey, type ParameterKey } from '@shared/parameters/keys';
import { Page } from '../../components/page';
import { SectionNav } from '../../components/section-nav';
import { ErrorState, LoadingState } from '../../components/states';
import { TankAlertsSection } from '../../features/alerts/components/tank-alerts-section';
import { can, useMe } from '../../lib/auth';
import { todayIn } from '../../lib/format';
import { EquipmentList } from '../../features/equipment/components/equipment-list';
import { PowerBoardMap } from '../../features/equipment/components/power-board-map';
import { useEquipment } from '../../lib/queries/equipment';
import { useComfortRange } from '../../features/livestock/api/get-comfort-range';
import { useLivestock } from '../../lib/queries/livestock';
import { ComfortRangePanel } from '../../features/livestock/components/comfort-range-panel';
import { LivestockGallery } from '../../features/livestock/components/livestock-gallery';
import { KeyReadings } from '../../features/readings/components/key-readings';
import { TankReadingsSection } from '../../features/readings/components/tank-readings-section';
import { useTank } from '../../features/tanks/api/get-tank';
import { TankAtAGlance } from '../../features/tanks/components/tank-at-a-glance';
import { TankOverview } from '../../features/tanks/components/tank-overview';
import { NextVisitLine } from '../../features/visits/components/next-visit-card';
import { TankVisitsSection } from '../../features/visits/components/tank-visits-section';
import { TankTimeline } from '../../features/timeline/components/tank-timeline';
import { TankTipsFeed } from '../../features/care-tips/components/tip-feed';
import { TankMessagesLink } from '../../features/conversations/components/tank-messages-link';
import { TankUrgentVisitAction } from '../../features/urgent/components/request-urgent-visit-action';

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
  children: React.ReactNode;
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

function LivestockSection({
  tankId,
  timeZone,
  isStaff,
}: {
  tankId: string;
  timeZone: string;
  isStaff: boolean;
}) {
  const livestock = useLivestock(tankId);
  const comfort = useComfortRange(tankId);
  return (
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
      {livestock.isPending ? (
        <LoadingState label="Loading livestock…" />
      ) : livestock.isError ? (
        <ErrorState error={livestock.error} what="the livestock" onRetry={() => void livestock.refetch()} />
      ) : (
        <LivestockGallery livestock={livestock.data} timeZone={timeZone} />
      )}
      {comfort.data && (comfort.data.species.length > 0 || comfort.data.conflicts.length > 0) && (
        <details className="mt-4 rounded-card bg-white p-4 shadow-card">
          <summary className="flex min-h-11 cursor-pointer items-center font-bold text-ink-900">
            Comfort range: the water they all tolerate
          </summary>
          <div className="mt-2">
            <ComfortRangePanel comfort={comfort.data} />
          </div>
        </details>
      )}
    </Section>
  );
}

function EquipmentSection({
  tankId,
  timeZone,
  isStaff,
}: {
  tankId: string;
  timeZone: string;
  isStaff: boolean;
}) {
  const equipment = useEquipment(tankId);
  return (
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
      {equipment.isPending ? (
        <LoadingState label="Loading equipment…" />
      ) : equipment.isError ? (
        <ErrorState error={equipment.error} what="the equipment" onRetry={() => void equipment.refetch()} />
      ) : (
        <div className="space-y-6">
          <PowerBoardMap equipment={equipment.data} />
          <div>
            <h3 className="mb-2 text-lg font-bold text-ink-900">Equipment and maintenance</h3>
            <EquipmentList equipment={equipment.data} today={todayIn(timeZone)} />
          </div>
        </div>
      )}
    </Section>
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
  const chosenParameter = parameterKey.safeParse(params.get('parameter'));
  // A notification links to one visit's report: ?section=visits&visit=<id>.
  const visitParam = z.uuid().safeParse(params.get('visit'));
  // A care tip's notification links to it on the timeline: ?section=timeline&tip=<id>.
  const tipParam = z.uuid().safeParse(params.get('tip'));
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
            <TankTipsFeed tankId={tankId} companyName={tank.data.company.name} />
          </div>
        )}
        {section === 'readings' && (
          <TankReadingsSection
            key={chosenParameter.data ?? 'first'}
            tankId={tankId}
            canEdit={isStaff}
            initialParameter={chosenParameter.success ? chosenParameter.data : undefined}
          />
        )}
        {section === 'visits' && (
          <Section
            id="visits-title"
            title="Visits"
            description="What each visit did, and when the next one is."
          >
            <TankVisitsSection
              tank={{
                id: tankId,
                name: tank.data.name,
                siteLabel: tank.data.siteLabel,
                companyName: tank.data.company.name,
              }}
              isStaff={isStaff}
              visitId={visitParam.success ? visitParam.data : null}
              hrefFor={(visitId) => `${sectionHref('visits')}&visit=${visitId}`}
            />
          </Section>
        )}
        {section === 'timeline' && (
          <Section
            id="timeline-title"
            title="Timeline"
            description="Everything that happened to this tank, newest first: visit reports, livestock changes, alerts and care tips."
          >
            <TankTimeline tankId={tankId} tipId={tipParam.success ? tipParam.data : null} />
          </Section>
        )}
        {section === 'livestock' && (
          <LivestockSection tankId={tankId} timeZone={timeZone} isStaff={isStaff} />
        )}
        {section === 'equipment' && (
          <EquipmentSection tankId={tankId} timeZone={timeZone} isStaff={isStaff} />
        )}
        {section === 'about' && <TankOverview tank={tank.data} />}
      </div>
    </Page>
  );
}
