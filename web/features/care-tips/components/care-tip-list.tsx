import { useState } from 'react';
import { Link } from 'react-router';
import type { CareTip } from '@shared/schemas/care-tips';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { TipCategoryBadge, TipStatusBadge } from '../../../components/tip-badges';
import { formatCount, formatDateTime } from '../../../lib/format';
import { useCareTips } from '../api/list-care-tips';
import { WithdrawTip } from './withdraw-tip';

const linkClass =
  'inline-flex min-h-11 items-center rounded-lg border border-ink-300 bg-white px-4 font-bold text-ink-900 no-underline hover:bg-ink-50';

const plural = (count: number, one: string, many: string) =>
  `${formatCount(count)} ${count === 1 ? one : many}`;

/** Where a tip stands, in words beside its badge. */
export function tipMoment(tip: CareTip): string {
  switch (tip.status) {
    case 'draft':
      return `Written ${formatDateTime(tip.createdAt)}`;
    case 'scheduled':
      return tip.sendAt ? `Goes out ${formatDateTime(tip.sendAt)}` : 'Waiting for its time';
    case 'sent':
      return tip.sentAt ? `Sent ${formatDateTime(tip.sentAt)}` : 'Sent';
    case 'withdrawn':
      return tip.withdrawnAt ? `Withdrawn ${formatDateTime(tip.withdrawnAt)}` : 'Withdrawn';
  }
}

export const canChange = (tip: Pick<CareTip, 'status'>) =>
  tip.status === 'draft' || tip.status === 'scheduled';
export const canWithdraw = (tip: Pick<CareTip, 'status'>) =>
  tip.status === 'sent' || tip.status === 'scheduled';

function TipRow({ tip, onDone }: { tip: CareTip; onDone: (message: string) => void }) {
  return (
    <li className="grid gap-3 rounded-card bg-white p-4 shadow-card sm:grid-cols-[minmax(0,1fr)_auto] sm:items-center">
      <div className="min-w-0">
        <h2 className="text-lg font-bold leading-snug">
          <Link
            to={`/console/tips/${tip.id}`}
            className="text-ink-900 underline decoration-ink-300 underline-offset-4 hover:decoration-ink-900"
          >
            {tip.title}
          </Link>
        </h2>
        <div className="mt-1 flex flex-wrap items-center gap-2 text-sm text-ink-700">
          <TipCategoryBadge category={tip.category} />
          <TipStatusBadge status={tip.status} />
          <span>{tipMoment(tip)}</span>
        </div>
        {(tip.status === 'sent' || tip.status === 'withdrawn') && (
          <p className="mt-1 text-sm text-ink-900">
            Reached {plural(tip.reached.tanks, 'tank', 'tanks')} and{' '}
            {plural(tip.reached.owners, 'owner', 'owners')}
            {' · '}
            {tip.helpfulCount === 0
              ? 'nobody has marked it helpful yet'
              : `${plural(tip.helpfulCount, 'owner', 'owners')} found it helpful`}
          </p>
        )}
      </div>
      <div className="flex flex-wrap gap-2">
        {canChange(tip) && (
          <Link to={`/console/tips/${tip.id}/edit`} className={linkClass}>
            Edit<span className="sr-only"> “{tip.title}”</span>
          </Link>
        )}
        {canWithdraw(tip) && <WithdrawTip tip={tip} onDone={onDone} />}
      </div>
    </li>
  );
}

/** The company's care tips, newest first, each with where it stands and how far it went. */
export function CareTipList() {
  const tips = useCareTips();
  const [message, setMessage] = useState<string | null>(null);
  return (
    <div>
      {/* Outside the list's grid, so the empty live region takes no room. */}
      <div role="status">
        {message && (
          <p className="mb-4 rounded-card border border-healthy-700/30 bg-healthy-100 p-4 font-bold text-healthy-700">
            {message}
          </p>
        )}
      </div>
      {tips.isPending ? (
        <LoadingState label="Loading the care tips…" />
      ) : tips.isError ? (
        <ErrorState error={tips.error} what="the care tips" onRetry={() => void tips.refetch()} />
      ) : tips.data.length === 0 ? (
        <EmptyState title="No care tips yet">
          Write one for every client, or for the tanks it concerns: a style, a species, a kind of equipment.
        </EmptyState>
      ) : (
        <ul className="grid gap-3">
          {tips.data.map((tip) => (
            <TipRow key={tip.id} tip={tip} onDone={setMessage} />
          ))}
        </ul>
      )}
    </div>
  );
}
