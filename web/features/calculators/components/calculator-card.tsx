import type { ReactNode } from 'react';

interface CalculatorCardProps {
  id: string;
  title: string;
  intro: ReactNode;
  children: ReactNode;
}

/** One calculator: its heading is the target of the page's table of contents. */
export function CalculatorCard({ id, title, intro, children }: CalculatorCardProps) {
  const titleId = `${id}-title`;
  return (
    <section
      id={id}
      aria-labelledby={titleId}
      className="scroll-mt-4 rounded-card bg-white p-5 shadow-card sm:p-6"
    >
      <h2 id={titleId} className="text-xl font-bold text-ink-900">
        {title}
      </h2>
      <p className="mt-1 text-ink-700">{intro}</p>
      <div className="mt-5 space-y-5">{children}</div>
    </section>
  );
}
