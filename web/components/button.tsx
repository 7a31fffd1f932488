import type { ButtonHTMLAttributes } from 'react';

const tones = {
  primary: 'bg-brine-700 text-white hover:bg-brine-600 disabled:bg-ink-300',
  secondary: 'border border-ink-300 bg-white text-ink-900 hover:bg-ink-50 disabled:text-ink-500',
  danger: 'bg-alert-700 text-white hover:opacity-90 disabled:opacity-50',
} as const;

/** Big enough for a wet thumb: at least 44 px tall (WCAG 2.2 target size). */
export function Button({
  tone = 'primary',
  className = '',
  type = 'button',
  ...props
}: ButtonHTMLAttributes<HTMLButtonElement> & { tone?: keyof typeof tones }) {
  return (
    <button
      type={type}
      className={`inline-flex min-h-11 items-center justify-center gap-2 rounded-lg px-4 py-2 font-bold transition-colors disabled:cursor-not-allowed ${tones[tone]} ${className}`}
      {...props}
    />
  );
}
