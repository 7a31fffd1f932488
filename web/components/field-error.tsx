import type { ReactNode } from 'react';

/**
 * A problem, marked by a shape and bold text as well as colour. Its own module, without the form
 * library, so screens that show a failed request outside a form (the notification bell in every
 * page's header) do not load the forms.
 */
export function FieldError({
  id,
  className = 'mt-2',
  children,
}: {
  id?: string;
  className?: string;
  children: ReactNode;
}) {
  return (
    <p id={id} className={`${className} flex items-start gap-2 text-sm font-bold text-alert-700`}>
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
