import type { ReactNode } from 'react';
import { Link } from 'react-router';
import { alertSeverities, type AlertSeverity } from '@shared/alerts/kinds';
import { formatMoney } from '@shared/billing/money';
import { parameterKey } from '@shared/parameters/keys';
import { formatValue } from '@shared/parameters/units';
import type { UrgentRequestView } from '@shared/schemas/urgent-requests';
import { defaultFirstAid, urgentCategoryNames } from '@shared/urgent/categories';
import { openUrgentStatuses, urgentStatusNames, type UrgentStatus } from '@shared/urgent/lifecycle';
import { SeverityBadge } from '../../../components/alert-badges';
import { SectionCard } from '../../../components/section-card';
import { can, useMe } from '../../../lib/auth';
import { formatDateTime, formatNumber, relativeTime, useNow } from '../../../lib/format';
import { useUrgentSettings } from '../api/get-urgent-settings';
import { formatAge } from '../utils/urgent-text';
import { zoneName } from '../utils/wall-clock';
import { DraftInvoiceButton } from '../../../components/draft-invoice-button';
import { FirstAidPanel } from './first-aid-panel';
import { UrgentStatusBadge } from './urgent-status-badge';
import { UrgentStatusStepper } from './urgent-status-stepper';

/** The reading as every other screen writes it, when its parameter is one Brinewatch knows. */
function readingText(reading: UrgentRequestView['snapshot']['readings'][number]): string {
  const parameter = parameterKey.safeParse(reading.parameter);
  return parameter.success
    ? formatValue(parameter.data, reading.value)
    : `${formatNumber(reading.value, 3)} ${reading.unit}`.trim();
}

const isOpen = (status: UrgentStatus) => (openUrgentStatuses as readonly UrgentStatus[]).includes(status);
const isSeverity = (value: string): value is AlertSeverity =>
  (alertSeverities as readonly string[]).includes(value);

function Fact({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="min-w-0">
      <dt className="text-sm font-bold text-ink-700">{term}</dt>
      <dd className="break-words text-ink-950">{children}</dd>
    </div>
  );
}

/** "in 25 min" or "25 min ago": how far the promised arrival is from now. */
function etaDistance(eta: string, now: number): string {
  const ms = Date.parse(eta) - now;
  return ms >= 0 ? `in ${formatAge(ms)}` : `${formatAge(-ms)} ago`;
}

function describeEvent(event: UrgentRequestView['events'][number]): string {
  const who = event.actorName ? ` by ${event.actorName}` : '';
  if (event.type === 'escalated') return 'Escalated: not acknowledged within the target';
  if (event.type === 'requested') return `Requested${who}`;
  return `${urgentStatusNames[event.type]}${who}`;
}

/** Where the request stands: status, arrival, who is coming, or why not and what to do instead. */
function StatusCard({ request, isStaff }: { request: UrgentRequestView; isStaff: boolean }) {
  const now = useNow(30_000);
  const { data: me } = useMe();
  const visitHref =
    request.visitId === null
      ? null
      : isStaff
        ? `/visits/${request.visitId}`
        : `/tanks/${request.tankId}?section=visits&visit=${request.visitId}`;
  return (
    <section aria-labelledby="urgent-status-title" className="rounded-card bg-white p-4 shadow-card sm:p-6">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="urgent-status-title" className="text-lg font-bold text-ink-900 sm:text-xl">
          {urgentCategoryNames[request.category].label}
        </h2>
        <UrgentStatusBadge status={request.status} size="lg" />
      </div>
      <p className="mt-1 text-sm text-ink-700">
        Requested{' '}
        <time dateTime={request.createdAt}>{formatDateTime(request.createdAt, request.timeZone)}</time> (
        {relativeTime(request.createdAt, now)}) by {request.requestedBy.name}
      </p>
      {request.status === 'declined' && (
        <div
          role="note"
          aria-labelledby="urgent-declined-title"
          className="mt-4 rounded-lg border-4 border-ink-800 bg-sand-100 p-4"
        >
          <h3 id="urgent-declined-title" className="flex items-center gap-2 text-lg font-bold text-ink-900">
            <span
              aria-hidden="true"
              className="flex h-7 w-7 items-center justify-center rounded-full bg-ink-800 text-white"
            >
              ✕
            </span>
            We cannot come out for this request
          </h3>
          {request.declineReason && (
            <p className="mt-2 text-ink-950">
              <span className="font-bold">Why: </span>
              {request.declineReason}
            </p>
          )}
          {request.advice && (
            <div className="mt-3 rounded-lg border-l-8 border-alert-700 bg-white p-3">
              <p className="font-bold text-alert-700">What to do instead</p>
              <p className="mt-1 text-lg whitespace-pre-line text-ink-950">{request.advice}</p>
            </div>
          )}
        </div>
      )}
      {(request.eta || request.technician) && isOpen(request.status) && (
        <dl className="mt-4 grid gap-3 rounded-lg bg-brine-100 p-4 sm:grid-cols-2">
          {request.eta && (
            <Fact term="Expected arrival">
              <span className="block text-lg font-bold">
                <time dateTime={request.eta}>{formatDateTime(request.eta, request.timeZone)}</time>
              </span>
              <span className="block text-sm">
                {etaDistance(request.eta, now)} · {zoneName(request.timeZone)}
              </span>
            </Fact>
          )}
          {request.technician && (
            <Fact term="Technician">
              <span className="text-lg font-bold">{request.technician.name}</span>
            </Fact>
          )}
        </dl>
      )}
      {request.status === 'resolved' && (
        <p className="mt-4 rounded-lg bg-healthy-100 p-4 text-ink-950">
          <span className="font-bold">Resolved</span>
          {request.closedAt && (
            <>
              {' '}
              <time dateTime={request.closedAt}>{formatDateTime(request.closedAt, request.timeZone)}</time>
            </>
          )}
          {request.technician && <> by {request.technician.name}</>}.{' '}
          {visitHref ? (
            <Link to={visitHref} className="font-bold text-brine-700">
              {isStaff ? 'Open the urgent visit’s report' : 'Read the urgent visit’s report'}
            </Link>
          ) : (
            'The visit report follows once the technician has written it.'
          )}
        </p>
      )}
      {request.status === 'resolved' && isStaff && can(me, 'invoices:manage') && (
        <div className="mt-3">
          <DraftInvoiceButton source={{ urgentRequestId: request.id }} />
        </div>
      )}
      {/* The answer first (why not, when, or done), then the way there. */}
      <div className="mt-4">
        <UrgentStatusStepper request={request} />
      </div>
    </section>
  );
}

/** What the owner told us, and what Brinewatch attached from the tank at that moment. */
function RequestFacts({ request, isStaff }: { request: UrgentRequestView; isStaff: boolean }) {
  const { readings, openAlerts } = request.snapshot;
  return (
    <>
      <SectionCard title="What was reported">
        <p className="whitespace-pre-line break-words text-ink-950">{request.description}</p>
        {request.equipment && (
          <p className="rounded-lg bg-ink-50 p-3 text-ink-950">
            <span className="font-bold">Equipment: </span>
            {request.equipment.name}
            {request.equipment.outlet ? ` — ${request.equipment.outlet}` : ' (outlet not recorded)'}.{' '}
            <Link to={`/tanks/${request.tankId}?section=equipment`} className="font-bold text-brine-700">
              Power board map
            </Link>
          </p>
        )}
        {request.photos.length > 0 && (
          <ul
            aria-label="Photos sent with the request"
            className="grid grid-cols-2 gap-2 sm:grid-cols-3 lg:grid-cols-5"
          >
            {request.photos.map((photo, index) => (
              <li key={photo.id}>
                <a href={photo.url} className="block overflow-hidden rounded-lg border-2 border-ink-100">
                  <img
                    src={photo.thumbnailUrl}
                    alt={`Sent with the request, ${index + 1} of ${request.photos.length}`}
                    className="aspect-square w-full object-cover"
                    loading="lazy"
                  />
                </a>
              </li>
            ))}
          </ul>
        )}
        <dl className="grid gap-3 sm:grid-cols-2">
          <Fact term="Someone with the tank now">{request.someoneOnSite ? 'Yes' : 'No'}</Fact>
          <Fact term="Phone">
            {isStaff ? (
              <a
                href={`tel:${request.phone.replace(/\s/g, '')}`}
                className="inline-flex min-h-11 items-center font-bold text-brine-700"
              >
                {request.phone}
              </a>
            ) : (
              request.phone
            )}
          </Fact>
          <Fact term="Best time to reach them">{request.bestTime || 'Not given'}</Fact>
          <Fact term="How to get in">
            <span className="whitespace-pre-line">{request.access || 'Not given'}</span>
          </Fact>
          {request.callOutFeeCents !== null && request.callOutFeeCents > 0 && (
            <Fact term="Call-out fee accepted">
              {formatMoney(request.callOutFeeCents, request.currency)}, charged once a technician comes out
            </Fact>
          )}
        </dl>
      </SectionCard>
      <SectionCard
        title="Attached automatically"
        hint="The tank’s latest readings and open alerts when the request was sent."
      >
        {readings.length === 0 ? (
          <p className="text-ink-700">No readings were on record.</p>
        ) : (
          <ul aria-label="Latest readings" className="grid grid-cols-2 gap-2 lg:grid-cols-3">
            {readings.map((reading) => (
              <li key={reading.parameter} className="rounded-lg bg-ink-50 p-3">
                <span className="block text-sm text-ink-700">{reading.label}</span>
                <span className="block text-lg font-bold text-ink-950">{readingText(reading)}</span>
                <span className="block text-xs text-ink-700">
                  <time dateTime={reading.at}>{formatDateTime(reading.at, request.timeZone)}</time>
                </span>
              </li>
            ))}
          </ul>
        )}
        {openAlerts.length === 0 ? (
          <p className="text-ink-700">No alerts were open.</p>
        ) : (
          <ul aria-label="Open alerts" className="grid gap-2">
            {openAlerts.map((alert) => (
              <li key={alert.id} className="flex flex-wrap items-center gap-2 rounded-lg bg-ink-50 p-3">
                {isSeverity(alert.severity) && <SeverityBadge severity={alert.severity} />}
                <span className="font-bold text-ink-950">{alert.title}</span>
                <span className="text-sm text-ink-700">
                  open since{' '}
                  <time dateTime={alert.openedAt}>{formatDateTime(alert.openedAt, request.timeZone)}</time>
                </span>
              </li>
            ))}
          </ul>
        )}
      </SectionCard>
      <SectionCard title="History">
        <ol className="relative space-y-3 border-l-2 border-ink-100 pl-5">
          {request.events.map((event) => (
            <li key={event.id} className="relative">
              <span
                aria-hidden="true"
                className="absolute top-1.5 -left-[1.6rem] h-2.5 w-2.5 rounded-full border-2 border-ink-700 bg-white"
              />
              <p className="font-bold text-ink-900">{describeEvent(event)}</p>
              <p className="text-sm text-ink-700">
                <time dateTime={event.at}>{formatDateTime(event.at, request.timeZone)}</time>
                {event.eta && (
                  <>
                    {' '}
                    · arrival expected{' '}
                    <time dateTime={event.eta}>{formatDateTime(event.eta, request.timeZone)}</time>
                  </>
                )}
              </p>
              {event.note && (
                <blockquote className="mt-1 rounded-md bg-ink-50 px-3 py-2 whitespace-pre-line text-ink-900">
                  {event.note}
                </blockquote>
              )}
            </li>
          ))}
        </ol>
      </SectionCard>
    </>
  );
}

/** The first-aid steps again, folded away, for as long as help has not arrived. */
function FirstAidAgain({ request, isStaff }: { request: UrgentRequestView; isStaff: boolean }) {
  const settings = useUrgentSettings();
  const firstAid = settings.data?.firstAid[request.category] ?? defaultFirstAid[request.category];
  return (
    <details className="group rounded-card bg-white p-4 shadow-card sm:p-6">
      <summary className="flex min-h-11 cursor-pointer list-none items-center gap-2 text-lg font-bold text-ink-900 [&::-webkit-details-marker]:hidden">
        <span aria-hidden="true" className="inline-block transition-transform group-open:rotate-90">
          ▸
        </span>
        {isStaff ? 'First aid and safety the owner was shown' : 'First aid and safety while you wait'}
      </summary>
      <div className="mt-3">
        <FirstAidPanel
          category={request.category}
          firstAid={firstAid}
          powerBoardHref={`/tanks/${request.tankId}?section=equipment`}
          headingLevel={3}
        />
      </div>
    </details>
  );
}

/**
 * One urgent request for the owner and for staff alike; `actions` (staff only) sits right under the
 * status, where the next move is decided.
 */
export function UrgentRequestDetail({
  request,
  isStaff,
  actions,
}: {
  request: UrgentRequestView;
  isStaff: boolean;
  actions?: ReactNode;
}) {
  return (
    <div className="grid grid-cols-[minmax(0,1fr)] gap-4">
      <StatusCard request={request} isStaff={isStaff} />
      {actions}
      {isOpen(request.status) && <FirstAidAgain request={request} isStaff={isStaff} />}
      <RequestFacts request={request} isStaff={isStaff} />
    </div>
  );
}
