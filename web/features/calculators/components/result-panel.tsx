import type { ReactNode } from 'react';
import type { ResultStatus } from '../utils/result-status';

interface ResultPanelProps {
  status: ResultStatus;
  children: ReactNode;
  /** The published sources of the equations, shown under the result. */
  source: ReactNode;
}

function listInWords(labels: string[]): string {
  const lower = labels.map((label) => label.charAt(0).toLowerCase() + label.slice(1));
  if (lower.length <= 1) return lower.join('');
  return `${lower.slice(0, -1).join(', ')} and ${lower.at(-1)}`;
}

/** Results update as the person types, so they sit in a polite live region. */
export function ResultPanel({ status, children, source }: ResultPanelProps) {
  return (
    <div className="rounded-lg border-2 border-ink-100 bg-ink-50 p-4">
      <h3 className="text-sm font-bold uppercase tracking-wider text-ink-700">Result</h3>
      <div aria-live="polite" className="mt-2">
        {status.kind === 'ready' && children}
        {status.kind === 'missing' && (
          <p className="text-ink-900">Fill in the {listInWords(status.labels)} to see the result.</p>
        )}
        {status.kind === 'problem' && <p className="font-bold text-alert-700">{status.message}</p>}
      </div>
      <div className="mt-4 border-t border-ink-100 pt-3 text-sm text-ink-700">{source}</div>
    </div>
  );
}

interface ResultValueProps {
  label: string;
  detail?: string;
  value: string;
  unit?: string;
  testId: string;
}

/** One line of a result list; render inside `<ResultList>`. */
export function ResultValue({ label, detail, value, unit, testId }: ResultValueProps) {
  return (
    <div>
      <dt className="text-sm font-bold text-ink-700">
        {label}
        {detail && <span className="block font-normal">{detail}</span>}
      </dt>
      <dd className="text-2xl font-bold text-ink-950">
        <span data-testid={testId}>{value}</span>
        {unit && <span className="ml-1.5 text-base font-normal text-ink-700">{unit}</span>}
      </dd>
    </div>
  );
}

/** A result line the equations cannot give for these values, with the reason. */
export function ResultUnavailable({
  label,
  detail,
  reason,
  testId,
}: Omit<ResultValueProps, 'value' | 'unit'> & { reason: string }) {
  return (
    <div>
      <dt className="text-sm font-bold text-ink-700">
        {label}
        {detail && <span className="block font-normal">{detail}</span>}
      </dt>
      <dd className="text-ink-900">
        <span data-testid={testId} className="text-lg font-bold">
          Not available
        </span>
        <span className="block text-sm">{reason}</span>
      </dd>
    </div>
  );
}

export function ResultList({ children }: { children: ReactNode }) {
  return <dl className="grid gap-4 sm:grid-cols-2">{children}</dl>;
}
