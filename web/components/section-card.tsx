import { useId, type ReactNode } from 'react';

/**
 * One titled block of a long screen (a visit report, a care tip): on a phone each reads as its own
 * card, named by its heading for screen readers.
 */
export function SectionCard({
  title,
  hint,
  children,
}: {
  title: string;
  hint?: ReactNode;
  children: ReactNode;
}) {
  const id = useId();
  return (
    <section aria-labelledby={id} className="min-w-0 rounded-card bg-white p-4 shadow-card sm:p-6">
      <h2 id={id} className="text-lg font-bold text-ink-900">
        {title}
      </h2>
      {hint && <p className="mt-1 text-sm text-ink-700">{hint}</p>}
      <div className="mt-3 grid grid-cols-[minmax(0,1fr)] gap-4">{children}</div>
    </section>
  );
}
