import { useId } from 'react';
import type { FirstSteps } from '@shared/alerts/first-steps';

/** What an owner can do now for an open alert (no visit is implied), with the safety cautions that go with it. */
export function FirstStepsPanel({ steps, headingLevel = 3 }: { steps: FirstSteps; headingLevel?: 3 | 4 }) {
  const id = useId();
  const Heading = headingLevel === 3 ? 'h3' : 'h4';
  return (
    <section aria-labelledby={`${id}-steps`} className="mt-4 rounded-lg bg-sand-100 p-4">
      <Heading id={`${id}-steps`} className="font-bold text-ink-900">
        What you can do now
      </Heading>
      <ol className="mt-2 list-decimal space-y-1.5 pl-5 text-ink-900">
        {steps.steps.map((step) => (
          <li key={step}>{step}</li>
        ))}
      </ol>
      <div className="mt-4 border-l-4 border-watch-700 bg-white p-3">
        <p className="flex items-center gap-2 font-bold text-watch-700">
          <svg viewBox="0 0 16 16" className="h-4 w-4 shrink-0" aria-hidden="true" focusable="false">
            <rect x="1" y="1" width="14" height="14" rx="4" fill="currentColor" />
            <path d="M8 4v5M8 11v1.5" stroke="white" strokeWidth="2" />
          </svg>
          Stay safe
        </p>
        <ul className="mt-2 space-y-2 text-sm text-ink-900">
          {steps.cautions.map((caution) => (
            <li key={caution}>{caution}</li>
          ))}
        </ul>
      </div>
    </section>
  );
}
