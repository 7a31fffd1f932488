import type { ReactNode } from 'react';

const sizes = {
  sm: 'gap-1 px-2 py-0.5 text-xs',
  md: 'gap-1.5 px-2.5 py-0.5 text-sm',
  lg: 'gap-2 px-3 py-1 text-base',
} as const;

/**
 * The one badge every status badge builds on: a pill with a word and a shape, so that meaning
 * never rests on colour alone. `tone` carries the colour classes, `mark` the shape (aria-hidden).
 */
export function Badge({
  tone,
  mark,
  size = 'md',
  className = '',
  children,
}: {
  tone: string;
  mark?: ReactNode;
  size?: keyof typeof sizes;
  className?: string;
  children: ReactNode;
}) {
  return (
    <span
      className={`inline-flex items-center rounded-full font-bold whitespace-nowrap ${sizes[size]} ${tone} ${className}`}
    >
      {mark && (
        <span aria-hidden="true" className="inline-flex shrink-0">
          {mark}
        </span>
      )}
      {children}
    </span>
  );
}
