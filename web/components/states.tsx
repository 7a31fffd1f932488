import type { ReactNode } from 'react';
import { ApiError } from '../lib/api-client';

export function LoadingState({ label }: { label: string }) {
  return (
    <div role="status" className="flex items-center gap-3 rounded-card bg-white p-6 text-ink-700 shadow-card">
      <span
        className="h-5 w-5 animate-spin rounded-full border-2 border-ink-300 border-t-brine-600"
        aria-hidden="true"
      />
      <span>{label}</span>
    </div>
  );
}

export function EmptyState({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="rounded-card border border-dashed border-ink-300 bg-white p-8 text-center">
      <p className="font-bold text-ink-900">{title}</p>
      {children && <div className="mt-2 text-sm text-ink-700">{children}</div>}
    </div>
  );
}

/** Plain words for what went wrong, and a way to try again. */
export function ErrorState({ error, onRetry, what }: { error: unknown; onRetry?: () => void; what: string }) {
  const message =
    error instanceof ApiError && error.status === 0
      ? 'Brinewatch could not be reached. Check your connection.'
      : error instanceof ApiError && error.status === 404
        ? `We could not find ${what}. It may have been removed, or it is not shared with you.`
        : `We could not load ${what}. Please try again in a moment.`;
  return (
    <div role="alert" className="rounded-card border border-alert-700/30 bg-alert-100 p-5 text-alert-700">
      <p className="font-bold">{message}</p>
      {onRetry && (
        <button
          type="button"
          onClick={onRetry}
          className="mt-3 min-h-11 rounded-lg bg-alert-700 px-4 py-2 font-bold text-white hover:opacity-90"
        >
          Try again
        </button>
      )}
    </div>
  );
}
