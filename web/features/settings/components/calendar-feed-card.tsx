import { useId, useRef, useState, type ReactNode } from 'react';
import { Button } from '../../../components/button';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { FieldError } from '../../../components/field-error';
import { ErrorState, LoadingState } from '../../../components/states';
import { problemMessage } from '../../../lib/problem-message';
import { useCalendarFeed } from '../api/get-calendar-feed';
import { useIssueCalendarFeed } from '../api/issue-calendar-feed';
import { useRevokeCalendarFeed } from '../api/revoke-calendar-feed';

type Question = 'reset' | 'stop' | null;

/**
 * The person's visits as a calendar their own calendar app subscribes to. The address holds a
 * secret: it is shown once, when made, and resetting it cuts off every calendar that had the old one.
 */
export function CalendarFeedCard() {
  const id = useId();
  const feed = useCalendarFeed();
  const issue = useIssueCalendarFeed();
  const revoke = useRevokeCalendarFeed();
  const [address, setAddress] = useState<string | null>(null);
  const [copied, setCopied] = useState<boolean | null>(null);
  const [question, setQuestion] = useState<Question>(null);
  const addressInput = useRef<HTMLInputElement>(null);

  const makeAddress = () =>
    issue.mutate(undefined, {
      onSuccess: ({ url }) => {
        setAddress(url);
        setCopied(null);
        setQuestion(null);
      },
    });

  const stopFeed = () =>
    revoke.mutate(undefined, {
      onSuccess: () => {
        setAddress(null);
        setQuestion(null);
      },
    });

  const copy = async () => {
    if (!address) return;
    try {
      await navigator.clipboard.writeText(address);
      setCopied(true);
    } catch {
      // No clipboard here (plain http, or refused): select it so the person can copy it themselves.
      addressInput.current?.select();
      setCopied(false);
    }
  };

  const closeQuestion = () => {
    setQuestion(null);
    issue.reset();
    revoke.reset();
  };

  let body: ReactNode;
  if (feed.isPending) body = <LoadingState label="Checking your calendar feed…" />;
  else if (feed.isError) {
    body = <ErrorState error={feed.error} what="your calendar feed" onRetry={() => void feed.refetch()} />;
  } else if (!feed.data.active) {
    body = (
      <>
        <p className="text-ink-900">Off: no calendar gets your visits from Brinewatch.</p>
        <Button className="mt-3" onClick={makeAddress} disabled={issue.isPending}>
          {issue.isPending ? 'Creating…' : 'Create calendar address'}
        </Button>
        <div role="alert">{issue.error && <FieldError>{problemMessage(issue.error)}</FieldError>}</div>
      </>
    );
  } else {
    body = (
      <>
        {address ? (
          <div role="status" className="rounded-lg border-2 border-healthy-700 bg-healthy-100 p-4">
            <p className="font-bold text-healthy-700">
              ✓ Your calendar address is ready. Copy it now: it is not shown again.
            </p>
            <label htmlFor={`${id}-address`} className="mt-2 block text-sm font-bold text-ink-900">
              Calendar address
            </label>
            <div className="mt-1 flex gap-2">
              <input
                ref={addressInput}
                id={`${id}-address`}
                readOnly
                value={address}
                onFocus={(event) => event.target.select()}
                className="min-h-11 w-full min-w-0 rounded-lg border-2 border-ink-300 bg-white px-3 font-mono text-sm"
              />
              <Button onClick={() => void copy()} className="shrink-0">
                {copied ? '✓ Copied' : 'Copy'}
              </Button>
            </div>
            {copied === false && (
              <p className="mt-2 text-sm text-ink-800">
                This browser would not copy it: the address is selected, so copy it from the box.
              </p>
            )}
            <p className="mt-2 text-sm text-ink-800">
              In your calendar app, choose to add or subscribe to a calendar from an address (URL), and paste
              it there. Anyone with the address can see these visits, so keep it to yourself.
            </p>
            <Button tone="secondary" className="mt-2" onClick={() => setAddress(null)}>
              Done
            </Button>
          </div>
        ) : (
          <p className="text-ink-900">
            On: a calendar address is in use. If you lost it, or someone else may have it, reset it.
          </p>
        )}
        <div className="mt-3 flex flex-wrap gap-2">
          <Button tone="secondary" onClick={() => setQuestion('reset')}>
            Reset address
          </Button>
          <Button tone="secondary" onClick={() => setQuestion('stop')}>
            Stop the feed
          </Button>
        </div>
      </>
    );
  }

  return (
    <section aria-labelledby={`${id}-title`} className="rounded-card bg-white p-4 shadow-card sm:p-6">
      <h2 id={`${id}-title`} className="text-xl font-bold text-ink-900">
        Calendar feed
      </h2>
      <p className="mt-1 text-sm text-ink-700">
        See your service visits in your own calendar app, kept up to date through a private address.
      </p>
      <div className="mt-4">{body}</div>

      <ConfirmDialog
        open={question === 'reset'}
        title="Reset the calendar address?"
        confirmLabel="Reset address"
        pendingLabel="Resetting…"
        pending={issue.isPending}
        error={issue.error ? problemMessage(issue.error) : undefined}
        onConfirm={makeAddress}
        onClose={closeQuestion}
      >
        <p>
          The old address will stop working: calendars subscribed to it no longer get your visits. You get a
          new address to subscribe with.
        </p>
      </ConfirmDialog>
      <ConfirmDialog
        open={question === 'stop'}
        title="Stop the calendar feed?"
        confirmLabel="Stop the feed"
        pendingLabel="Stopping…"
        pending={revoke.isPending}
        error={revoke.error ? problemMessage(revoke.error) : undefined}
        onConfirm={stopFeed}
        onClose={closeQuestion}
      >
        <p>
          The address will stop working, and calendars subscribed to it no longer get your visits. You can
          create a new address at any time.
        </p>
      </ConfirmDialog>
    </section>
  );
}
