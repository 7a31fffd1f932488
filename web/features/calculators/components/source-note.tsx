import type { ReactNode } from 'react';

/** Names the published equation under a result; one line per source. */
export function SourceNote({ children }: { children: ReactNode }) {
  return (
    <div className="space-y-1">
      <p className="font-bold text-ink-900">Where this comes from</p>
      {children}
    </div>
  );
}
