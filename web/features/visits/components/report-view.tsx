import { useState, type ReactNode } from 'react';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import { unitDecimals, unitSymbol } from '@shared/parameters/units';
import { photoUrls } from '@shared/schemas/photos';
import {
  equipmentCheckStateLabels,
  visitKindLabels,
  visitTaskLabels,
  type EquipmentCheckState,
  type LivestockChange,
  type VisitDetail,
  type VisitReportContent,
} from '@shared/schemas/visits';
import { equipmentKindLabels } from '@shared/schemas/equipment';
import { Badge } from '../../../components/badge';
import { Button } from '../../../components/button';
import { Markdown } from '../../../components/markdown';
import { ErrorState, LoadingState } from '../../../components/states';
import {
  formatDate,
  formatDateTime,
  formatFixed,
  formatNumber,
  formatTime,
  formatWeekday,
} from '../../../lib/format';
import { useEquipment } from '../../../lib/queries/equipment';
import { useLivestock } from '../../../lib/queries/livestock';
import { useVisitVersion } from '../api/get-visit';

/*
 * A published visit report as the client reads it, and as it prints: who came, when, what was done
 * with its numbers, what was found, the photos, the notes (Markdown) and what comes next.
 */

const checkLooks: Readonly<Record<EquipmentCheckState, { tone: string; mark: string }>> = {
  ok: { tone: 'bg-healthy-100 text-healthy-700', mark: 'h-2 w-2 rounded-full bg-current' },
  'needs-attention': { tone: 'bg-watch-100 text-watch-700', mark: 'h-2 w-2 rotate-45 bg-current' },
  replaced: { tone: 'bg-ink-100 text-ink-900', mark: 'h-2 w-2 rounded-full border-2 border-current' },
};

function EquipmentCheckBadge({ state }: { state: EquipmentCheckState }) {
  const { tone, mark } = checkLooks[state];
  return (
    <Badge tone={tone} size="sm" mark={<span className={mark} />}>
      {equipmentCheckStateLabels[state]}
    </Badge>
  );
}

/** A calendar day and wall times from the report ("2026-12-22", "09:00") as people read them. */
const plannedWindow = (next: NonNullable<VisitReportContent['nextVisit']>) =>
  `${formatWeekday(`${next.date}T00:00:00Z`, 'UTC')} ${next.date.slice(0, 4)}, ${next.startTime}–${next.endTime}`;

function Part({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section className="break-inside-avoid">
      <h4 className="text-base font-bold text-ink-900">{title}</h4>
      <div className="mt-1.5">{children}</div>
    </section>
  );
}

function livestockLine(
  change: LivestockChange,
  names: { byId: Map<string, string>; bySpecies: Map<string, string> },
): string {
  if (change.action === 'add') {
    const species = names.bySpecies.get(change.speciesId) ?? 'livestock';
    const nickname = change.nickname ? ` (“${change.nickname}”)` : '';
    const where = change.placement ? `, placed ${change.placement}` : '';
    return `Added ${change.quantity} × ${species}${nickname}${where}`;
  }
  const name = names.byId.get(change.livestockId) ?? 'an animal';
  if (change.action === 'remove') return `Removed ${name}${change.note ? `: ${change.note}` : ''}`;
  return `Moved ${name} to ${change.placement}`;
}

/** What the report says: every part it has, none it lacks. */
export function ReportBody({
  content,
  tankId,
  timeZone,
  usedItems,
}: {
  content: VisitReportContent;
  tankId: string;
  /** The tank's zone, which the report's times are read in. */
  timeZone: string;
  /** Names of the consumables and parts the report names (the visit detail carries them for everyone). */
  usedItems: VisitDetail['usedItems'];
}) {
  const priceItems = new Map(usedItems.map((item) => [item.id, item]));
  const equipment = useEquipment(tankId, content.equipmentChecks.length > 0);
  const livestock = useLivestock(tankId, content.livestockChanges.length > 0);
  const equipmentNames = new Map(
    (equipment.data ?? []).map((item) => [item.id, item.description || equipmentKindLabels[item.kind]]),
  );
  const names = {
    byId: new Map(
      (livestock.data ?? []).map((animal) => [
        animal.id,
        animal.nickname ? `${animal.nickname} (${animal.species.commonName})` : animal.species.commonName,
      ]),
    ),
    bySpecies: new Map(
      (livestock.data ?? []).map((animal) => [animal.species.id, animal.species.commonName]),
    ),
  };
  const { waterChange } = content;
  const tasks = content.tasksDone.filter((task) => task !== 'water-change');
  const photos = {
    before: content.photos.filter((p) => p.phase === 'before'),
    after: content.photos.filter((p) => p.phase === 'after'),
  };
  const hasNext = content.nextItems.length > 0 || content.nextVisit !== null;

  return (
    <div className="grid gap-5">
      {(waterChange || tasks.length > 0) && (
        <Part title="Done at the visit">
          <ul className="grid gap-1.5">
            {waterChange && (
              <li className="flex gap-2">
                <span aria-hidden="true" className="font-bold text-healthy-700">
                  ✓
                </span>
                <span>
                  <span className="font-bold">Water change:</span> {formatNumber(waterChange.percent)} % (
                  {formatNumber(waterChange.litres)} L)
                  {waterChange.newSalinityPpt != null &&
                    `, new water at ${formatFixed(waterChange.newSalinityPpt, 1)} ppt salinity`}
                </span>
              </li>
            )}
            {tasks.map((task) => (
              <li key={task} className="flex gap-2">
                <span aria-hidden="true" className="font-bold text-healthy-700">
                  ✓
                </span>
                <span>{visitTaskLabels[task]}</span>
              </li>
            ))}
          </ul>
        </Part>
      )}

      {content.dosingRefills.length > 0 && (
        <Part title="Dosing containers refilled">
          <ul className="grid gap-1">
            {content.dosingRefills.map((refill, index) => (
              <li key={index}>
                {refill.container}: {formatNumber(refill.amountMl, 0)}&nbsp;mL
              </li>
            ))}
          </ul>
        </Part>
      )}

      {content.equipmentChecks.length > 0 && (
        <Part title="Equipment checked">
          <ul className="grid gap-2">
            {content.equipmentChecks.map((check) => (
              <li key={check.equipmentId} className="flex flex-wrap items-center gap-x-2 gap-y-1">
                <span className="font-bold">
                  {equipmentNames.get(check.equipmentId) ??
                    (equipment.isPending ? 'Equipment' : 'Removed equipment')}
                </span>
                <EquipmentCheckBadge state={check.state} />
                {check.note && <span className="w-full text-sm text-ink-700">{check.note}</span>}
              </li>
            ))}
          </ul>
        </Part>
      )}

      {content.readings.length > 0 && (
        <Part title="Readings taken">
          <ul className="grid gap-1 sm:grid-cols-2">
            {content.readings.map((reading, index) => {
              const symbol = unitSymbol(reading.parameter, reading.unit);
              const value = formatFixed(reading.value, unitDecimals(reading.parameter, reading.unit));
              return (
                <li key={index} className="flex justify-between gap-3 border-b border-ink-100 py-1">
                  <span>{parameterCatalogue[reading.parameter].label}</span>
                  <span className="font-bold tabular-nums">
                    {symbol ? `${value} ${symbol}` : value}
                    <span className="sr-only"> at {formatTime(reading.measuredAt, timeZone)}</span>
                  </span>
                </li>
              );
            })}
          </ul>
        </Part>
      )}

      {content.livestockChanges.length > 0 && (
        <Part title="Livestock changes">
          <ul className="grid gap-1">
            {content.livestockChanges.map((change, index) => (
              <li key={index}>{livestockLine(change, names)}</li>
            ))}
          </ul>
        </Part>
      )}

      {content.itemsUsed.length > 0 && (
        <Part title="Consumables and parts used">
          <ul className="grid gap-1">
            {content.itemsUsed.map((used) => {
              const item = priceItems.get(used.priceItemId);
              return (
                <li key={used.priceItemId}>
                  <span className="font-bold tabular-nums">{formatNumber(used.quantity, 2)}</span> ×{' '}
                  {item ? item.name : 'an item no longer on the price list'}
                  {item && item.unit !== 'each' && <span className="text-ink-700"> ({item.unit})</span>}
                </li>
              );
            })}
          </ul>
        </Part>
      )}

      {content.photos.length > 0 && (
        <Part title="Photos">
          <div className="grid gap-3 sm:grid-cols-2">
            {(['before', 'after'] as const).map(
              (phase) =>
                photos[phase].length > 0 && (
                  <figure key={phase}>
                    <figcaption className="text-sm font-bold text-ink-700">
                      {phase === 'before' ? 'Before' : 'After'}
                    </figcaption>
                    <ul className="mt-1 flex flex-wrap gap-2">
                      {photos[phase].map((photo, index) => {
                        const urls = photoUrls(photo.photoId);
                        return (
                          <li key={photo.photoId}>
                            <a href={urls.url} target="_blank" rel="noreferrer" className="block">
                              <img
                                src={urls.thumbnailUrl}
                                alt={`${phase === 'before' ? 'Before' : 'After'} the visit, ${index + 1} of ${photos[phase].length}, full size`}
                                loading="lazy"
                                decoding="async"
                                className="h-24 w-32 rounded-lg bg-ink-100 object-cover"
                              />
                            </a>
                          </li>
                        );
                      })}
                    </ul>
                  </figure>
                ),
            )}
          </div>
        </Part>
      )}

      {content.notes.trim() !== '' && (
        <Part title="Notes">
          <Markdown source={content.notes} topHeading={5} />
        </Part>
      )}

      {hasNext && (
        <Part title="What comes next">
          {content.nextItems.length > 0 && (
            <ul className="grid list-disc gap-1 pl-5">
              {content.nextItems.map((item, index) => (
                <li key={index}>{item}</li>
              ))}
            </ul>
          )}
          {content.nextVisit && (
            <p className="mt-1.5">
              <span className="font-bold">Next visit:</span> {plannedWindow(content.nextVisit)}
            </p>
          )}
        </Part>
      )}
    </div>
  );
}

/** An earlier published text, loaded when asked for. */
function EarlierVersion({ visit, version }: { visit: VisitDetail; version: number }) {
  const earlier = useVisitVersion(visit.id, version);
  if (earlier.isPending) return <LoadingState label="Loading the earlier text…" />;
  if (earlier.isError) {
    return (
      <ErrorState error={earlier.error} what="the earlier text" onRetry={() => void earlier.refetch()} />
    );
  }
  return (
    <ReportBody
      content={earlier.data}
      tankId={visit.tankId}
      timeZone={visit.timeZone}
      usedItems={visit.usedItems}
    />
  );
}

function EarlierVersions({ visit }: { visit: VisitDetail }) {
  const [shown, setShown] = useState<number | null>(null);
  if (visit.earlierVersions.length === 0) return null;
  return (
    <details className="rounded-lg border border-ink-100 bg-ink-50 p-3 print:hidden">
      <summary className="flex min-h-11 cursor-pointer items-center font-bold text-brine-700">
        See the earlier text
      </summary>
      <ul className="mt-2 flex flex-wrap gap-2">
        {visit.earlierVersions.map((earlier) => (
          <li key={earlier.version}>
            <Button
              tone="secondary"
              aria-pressed={shown === earlier.version}
              onClick={() => setShown(shown === earlier.version ? null : earlier.version)}
            >
              As published {formatDateTime(earlier.publishedAt, visit.timeZone)}
            </Button>
          </li>
        ))}
      </ul>
      {shown !== null && (
        <div className="mt-3 rounded-lg border border-ink-300 bg-white p-3">
          <EarlierVersion visit={visit} version={shown} />
        </div>
      )}
    </details>
  );
}

/**
 * One published report in full, with its own print header (the company, the tank, the date and the
 * technician) and a Print button; `data-print-report` marks it as what a printout holds.
 */
export function ReportView({
  visit,
  tankName,
  siteLabel,
  companyName,
}: {
  visit: VisitDetail;
  tankName: string;
  siteLabel: string | null;
  companyName: string;
}) {
  const content = visit.published;
  if (!content) return null;
  const by = visit.publishedBy?.name ?? visit.technician?.name ?? 'Your technician';
  const zone = visit.timeZone;
  const visitDay = formatDate(content.arrivedAt ?? visit.windowStart, zone);
  const titleId = `report-${visit.id}-title`;
  const stay =
    content.arrivedAt &&
    `${formatTime(content.arrivedAt, zone)}${content.departedAt ? `–${formatTime(content.departedAt, zone)}` : ''}`;

  return (
    <article
      aria-labelledby={titleId}
      data-print-report
      className="rounded-card bg-white p-4 shadow-card sm:p-6 print:p-0 print:shadow-none"
    >
      <header className="hidden border-b-2 border-black pb-3 print:block">
        <p className="text-sm">{companyName}</p>
        <p className="text-2xl font-bold">Visit report: {tankName}</p>
        {siteLabel && <p>{siteLabel}</p>}
      </header>
      <div className="flex flex-wrap items-start justify-between gap-3 print:mt-3">
        <div>
          <h3 id={titleId} className="text-lg font-bold text-ink-900">
            {visitKindLabels[visit.kind]}, {visitDay}
          </h3>
          <p className="text-sm text-ink-700">
            Published {formatDateTime(visit.publishedAt ?? visit.windowStart, zone)}
            {visit.editedAt && <> · edited {formatDateTime(visit.editedAt, zone)}</>}
          </p>
        </div>
        <Button tone="secondary" onClick={() => window.print()} className="print:hidden">
          Print<span className="sr-only"> this report</span>
        </Button>
      </div>
      <dl className="mt-3 grid gap-x-6 gap-y-1 text-sm sm:grid-cols-[auto_1fr]">
        <dt className="font-bold text-ink-700">Technician</dt>
        <dd>{by}</dd>
        {stay && (
          <>
            <dt className="font-bold text-ink-700">At the tank</dt>
            <dd>{stay}</dd>
          </>
        )}
      </dl>
      {visit.editedAt && (
        <div className="mt-3">
          <EarlierVersions visit={visit} />
        </div>
      )}
      <div className="mt-5">
        <ReportBody content={content} tankId={visit.tankId} timeZone={zone} usedItems={visit.usedItems} />
      </div>
    </article>
  );
}
