import { presentStatuses } from '@shared/schemas/livestock-status';
import type { LivestockItem } from '@shared/schemas/livestock';
import { livestockStatusLabels } from '@shared/schemas/livestock';
import { capitalise, formatDate } from '../../../lib/format';
import { HandlingCaution, stingCaution } from './handling-caution';
import { LivestockPicture } from './livestock-picture';
import { LivestockStatusBadge } from './livestock-status-badge';

export function hazardOf(item: LivestockItem) {
  const { behaviour } = item.species.profile;
  return behaviour.toxic ?? (behaviour.stings ? stingCaution : undefined);
}

export function displayName(item: LivestockItem): string {
  return item.nickname ? `${item.nickname}` : capitalise(item.species.commonName);
}

function LivestockCard({ item, timeZone }: { item: LivestockItem; timeZone: string }) {
  const latest = item.history[0];
  const hazard = hazardOf(item);
  const photo = item.photos.at(-1);
  const name = displayName(item);
  return (
    // A thumbnail beside the words on a phone keeps a long list short; elsewhere the picture sits on top.
    <li className="grid grid-cols-[6.5rem_minmax(0,1fr)] content-start gap-x-3 overflow-hidden rounded-card bg-white p-3 shadow-card sm:flex sm:flex-col sm:p-0">
      <div className="aspect-square overflow-hidden rounded-lg sm:aspect-[4/3] sm:w-full sm:rounded-none">
        <LivestockPicture
          photo={photo}
          group={item.species.profile.group}
          alt={photo?.caption ? `${name}: ${photo.caption}` : `Photo of the ${item.species.commonName}`}
        />
      </div>
      <div className="flex min-w-0 flex-col gap-1.5 sm:px-4 sm:pt-4">
        <div className="flex flex-wrap items-start justify-between gap-2">
          <div className="min-w-0">
            <h3 className="text-lg font-bold text-ink-900">{name}</h3>
            <p className="text-sm text-ink-700">
              {item.nickname && <>{capitalise(item.species.commonName)} · </>}
              <i>{item.species.scientificName}</i>
              {item.quantity > 1 && <> · × {item.quantity}</>}
            </p>
          </div>
          <LivestockStatusBadge status={item.status} />
        </div>
        {item.placement && <p className="text-sm text-ink-700">Where: {item.placement}</p>}
      </div>
      <div className="col-span-2 mt-2 flex flex-1 flex-col gap-2 sm:px-4 sm:pb-4">
        {latest?.note && (
          <p className="text-sm text-ink-950">
            <span className="font-bold">{formatDate(latest.changedAt, timeZone)}</span>
            {latest.changedBy && <> · {latest.changedBy.name}</>}: {latest.note}
          </p>
        )}
        {hazard && <HandlingCaution hazard={hazard} compact />}
        <details className="mt-auto rounded-lg border border-ink-100">
          <summary className="flex min-h-11 cursor-pointer items-center px-3 font-bold text-brine-700">
            Care and history
          </summary>
          <div className="space-y-3 px-3 pb-3 text-sm">
            <p>{item.species.profile.careNotes}</p>
            {hazard && <HandlingCaution hazard={hazard} />}
            <ol className="space-y-2 border-l-2 border-ink-100 pl-3" aria-label={`History of ${name}`}>
              {item.history.map((event) => (
                <li key={event.id}>
                  <span className="font-bold">
                    {formatDate(event.changedAt, timeZone)} — {livestockStatusLabels[event.status]}
                  </span>
                  {event.changedBy && <span className="text-ink-700"> ({event.changedBy.name})</span>}
                  {event.note && <p className="text-ink-950">{event.note}</p>}
                </li>
              ))}
            </ol>
          </div>
        </details>
      </div>
    </li>
  );
}

/** What lives in the tank, with each animal's condition; the ones that have left are kept below. */
export function LivestockGallery({
  livestock,
  timeZone,
}: {
  livestock: readonly LivestockItem[];
  timeZone: string;
}) {
  const present = livestock.filter((item) => presentStatuses.includes(item.status));
  const gone = livestock.filter((item) => !presentStatuses.includes(item.status));
  return (
    <div className="space-y-4">
      {present.length === 0 ? (
        <p className="rounded-card border border-dashed border-ink-300 bg-white p-5 text-sm text-ink-700">
          No livestock recorded yet. Your technician adds fish, corals and plants at a visit.
        </p>
      ) : (
        <ul className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
          {present.map((item) => (
            <LivestockCard key={item.id} item={item} timeZone={timeZone} />
          ))}
        </ul>
      )}
      {gone.length > 0 && (
        <details className="rounded-card bg-white p-4 shadow-card">
          <summary className="flex min-h-11 cursor-pointer items-center font-bold text-ink-900">
            No longer in the tank ({gone.length})
          </summary>
          <ul className="mt-2 divide-y divide-ink-100">
            {gone.map((item) => (
              <li key={item.id} className="flex flex-wrap items-center justify-between gap-2 py-2 text-sm">
                <span>
                  <span className="font-bold">{displayName(item)}</span>
                  {item.history[0]?.note && <span className="text-ink-700"> — {item.history[0].note}</span>}
                </span>
                <LivestockStatusBadge status={item.status} />
              </li>
            ))}
          </ul>
        </details>
      )}
    </div>
  );
}
