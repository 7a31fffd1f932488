import type { ReactNode } from 'react';

/** A field's label with its unit read out (the unit shown beside the box is hidden from screen readers). */
export function UnitLabel({
  children,
  unit,
  spoken,
}: {
  children: ReactNode;
  unit: string;
  spoken?: string;
}) {
  return (
    <>
      {children}
      <span className="sr-only"> ({spoken ?? unit})</span>
    </>
  );
}

/** The unit beside a field's box, said once already in its label. */
export function UnitSuffix({ unit }: { unit: string }) {
  return <span aria-hidden="true">{unit}</span>;
}
