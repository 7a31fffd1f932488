import type { ReactNode } from 'react';

/** A field's problem, beside the field, marked by a shape and bold text as well as colour. */
export function FieldError({ id, children }: { id?: string; children: ReactNode }) {
  return (
    <p id={id} className="mt-2 flex items-start gap-2 text-sm font-bold text-alert-700">
      <span
        aria-hidden="true"
        className="mt-0.5 flex h-4 w-4 shrink-0 items-center justify-center rounded-full bg-alert-700 text-xs text-white"
      >
        !
      </span>
      <span>{children}</span>
    </p>
  );
}
