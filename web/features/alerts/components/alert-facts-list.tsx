import type { AlertView } from '@shared/schemas/alerts';
import { formatDateTime, relativeTime } from '../../../lib/format';
import { readingFacts } from '../utils/alert-facts';

function When({ iso, now }: { iso: string; now: number }) {
  return (
    <time dateTime={iso} title={formatDateTime(iso)}>
      {relativeTime(iso, now)}
    </time>
  );
}

/**
 * A term over its value. Each pair spans two rows of the list's grid (subgrid), so a term that wraps
 * ("General hardness (GH)") lowers no value below its neighbours': values share a row.
 */
function Fact({ term, children }: { term: string; children: React.ReactNode }) {
  return (
    <div className="row-span-2 grid min-w-0 grid-rows-subgrid gap-y-0">
      <dt className="self-end text-xs font-bold uppercase tracking-wide text-ink-600">{term}</dt>
      <dd className="text-ink-900">{children}</dd>
    </div>
  );
}

/** The reading against its limit, since when, and who has it in hand. */
export function AlertFactsList({ alert, now }: { alert: AlertView; now: number }) {
  const facts = readingFacts(alert);
  return (
    <dl className="mt-3 grid grid-cols-2 gap-x-4 gap-y-2 text-sm sm:grid-cols-4">
      {facts && (
        <Fact term={facts.label}>
          <span className="font-bold">{facts.reading}</span>
        </Fact>
      )}
      {facts?.limit && <Fact term="Limit">{facts.limit}</Fact>}
      <Fact term="Since">
        <When iso={alert.openedAt} now={now} />
        <span className="block text-xs text-ink-700">{formatDateTime(alert.openedAt)}</span>
      </Fact>
      {alert.status === 'resolved' && alert.resolvedAt ? (
        <Fact term="Resolved">
          <When iso={alert.resolvedAt} now={now} />
        </Fact>
      ) : alert.acknowledgedAt ? (
        <Fact term="Acknowledged">
          {alert.acknowledgedBy ?? 'Staff'}, <When iso={alert.acknowledgedAt} now={now} />
        </Fact>
      ) : (
        <Fact term="Acknowledged">Not yet</Fact>
      )}
    </dl>
  );
}
