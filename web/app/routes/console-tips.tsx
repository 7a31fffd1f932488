import { useState } from 'react';
import { Link, useLocation, useParams } from 'react-router';
import { Page } from '../../components/page';
import { ErrorState, LoadingState } from '../../components/states';
import { useCareTip } from '../../features/care-tips/api/get-care-tip';
import { CareTipList, canChange, canWithdraw } from '../../features/care-tips/components/care-tip-list';
import { TipComposer, type ComposerNotice } from '../../features/care-tips/components/tip-composer';
import { TipDetail } from '../../features/care-tips/components/tip-detail';
import { WithdrawTip } from '../../features/care-tips/components/withdraw-tip';

const linkClass =
  'inline-flex min-h-11 items-center rounded-lg border border-ink-300 bg-white px-4 font-bold text-ink-900 no-underline hover:bg-ink-50';
const primaryLinkClass =
  'inline-flex min-h-11 items-center rounded-lg bg-brine-700 px-4 font-bold text-white no-underline hover:bg-brine-600';

export function ConsoleTipsRoute() {
  return (
    <Page
      title="Care tips"
      description="Advice sent to exactly the tanks it concerns, now or at a set time."
      actions={
        <Link to="/console/tips/new" className={primaryLinkClass}>
          Write a tip
        </Link>
      }
    >
      <title>Care tips — Brinewatch</title>
      <CareTipList />
    </Page>
  );
}

export function ConsoleTipNewRoute() {
  return (
    <Page title="Write a tip" description="Saved as a draft until you send it.">
      <title>Write a tip — Brinewatch</title>
      <TipComposer tip={null} />
    </Page>
  );
}

/** Loads a tip, showing the page's own loading and error states until it is there. */
function useTipPage(title: string) {
  const { tipId = '' } = useParams();
  const tip = useCareTip(tipId);
  const placeholder = tip.isPending ? (
    <Page title={title}>
      <LoadingState label="Loading the tip…" />
    </Page>
  ) : tip.isError ? (
    <Page title={title}>
      <ErrorState error={tip.error} what="this care tip" onRetry={() => void tip.refetch()} />
    </Page>
  ) : null;
  return { tip, placeholder };
}

export function ConsoleTipEditRoute() {
  const { tip, placeholder } = useTipPage('Change a tip');
  if (placeholder || !tip.data) return placeholder;
  if (!canChange(tip.data)) {
    return (
      <Page title="Change a tip">
        <p className="rounded-card bg-white p-4 shadow-card">
          This tip was {tip.data.status} and can no longer be changed.{' '}
          <Link to={`/console/tips/${tip.data.id}`} className="font-bold text-brine-700">
            Open it
          </Link>
        </p>
      </Page>
    );
  }
  return (
    <Page title="Change a tip" description={tip.data.title}>
      <title>Change a tip — Brinewatch</title>
      {/* Keyed by the tip, so its saved values start the form. */}
      <TipComposer key={tip.data.id} tip={tip.data} />
    </Page>
  );
}

export function ConsoleTipRoute() {
  const { tip, placeholder } = useTipPage('Care tip');
  const location = useLocation();
  const [withdrawn, setWithdrawn] = useState<string | null>(null);
  if (placeholder || !tip.data) return placeholder;
  const arrived = (location.state as ComposerNotice | null)?.notice ?? null;
  return (
    <Page
      title={tip.data.title}
      actions={
        <>
          <Link to="/console/tips" className={linkClass}>
            All tips
          </Link>
          {canChange(tip.data) && (
            <Link to={`/console/tips/${tip.data.id}/edit`} className={linkClass}>
              Edit
            </Link>
          )}
          {canWithdraw(tip.data) && <WithdrawTip tip={tip.data} onDone={setWithdrawn} />}
        </>
      }
    >
      <title>{`${tip.data.title} — Brinewatch`}</title>
      <TipDetail tip={tip.data} notice={withdrawn ?? arrived} />
    </Page>
  );
}
