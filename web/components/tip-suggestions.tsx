import { useId, useState } from 'react';
import { Button } from './button';
import { FieldError } from './field-error';
import { TipCategoryBadge } from './tip-badges';
import { problemMessage } from '../lib/problem-message';
import { useSendTipToTank, useTipSuggestions } from '../lib/queries/tip-suggestions';

/**
 * The company's care tips that fit what just happened at a tank (an anemone added, corals handled
 * on a visit) and that the tank has not received yet, each with why it is offered and one tap to
 * send it. Shown after staff add livestock or publish a visit report; says nothing when none fit.
 */
export function TipSuggestions({ tankId, className = '' }: { tankId: string; className?: string }) {
  const id = useId();
  const suggestions = useTipSuggestions(tankId);
  const send = useSendTipToTank(tankId);
  const [sent, setSent] = useState<string[]>([]);
  const [failed, setFailed] = useState<{ tipId: string; message: string } | null>(null);
  const offered = suggestions.data ?? [];
  if (offered.length === 0 && sent.length === 0) {
    return suggestions.isError ? (
      <p className={`text-sm text-ink-700 ${className}`}>Care tips for this tank could not be checked.</p>
    ) : null;
  }
  return (
    <section
      aria-labelledby={`${id}-title`}
      className={`grid gap-3 rounded-card border-2 border-brine-300 bg-brine-100/40 p-4 ${className}`}
    >
      <div>
        <h3 id={`${id}-title`} className="text-lg font-bold text-ink-900">
          Care tips that fit
        </h3>
        <p className="text-sm text-ink-700">
          Tips this tank has not received yet. The owners are told once sent.
        </p>
        {/* Inside the heading's block, so the live region adds no gap while it is empty. */}
        <div role="status">
          {sent.length > 0 && (
            <p className="mt-2 font-bold text-healthy-700">Sent to this tank: {sent.join(', ')}.</p>
          )}
        </div>
      </div>
      {offered.length > 0 && (
        <ul className="grid gap-2">
          {offered.map(({ tip, reason }) => (
            <li
              key={tip.id}
              className="flex flex-wrap items-center justify-between gap-3 rounded-lg bg-white p-3 shadow-card"
            >
              <div className="min-w-0 flex-1">
                <p className="font-bold text-ink-950">{tip.title}</p>
                <p className="mt-1 flex flex-wrap items-center gap-2 text-sm text-ink-700">
                  <TipCategoryBadge category={tip.category} />
                  <span>{reason}</span>
                </p>
                {failed?.tipId === tip.id && <FieldError>{failed.message}</FieldError>}
              </div>
              <Button
                tone="secondary"
                disabled={send.isPending}
                onClick={() => {
                  setFailed(null);
                  send.mutate(tip.id, {
                    onSuccess: () => setSent((titles) => [...titles, tip.title]),
                    onError: (error) => setFailed({ tipId: tip.id, message: problemMessage(error) }),
                  });
                }}
              >
                {send.isPending && send.variables === tip.id ? 'Sending…' : 'Send to this tank'}
                <span className="sr-only"> “{tip.title}”</span>
              </Button>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
