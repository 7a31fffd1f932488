/** Brinewatch's mark: a wave line in a rounded tank with two rising bubbles. */
export function BrandMark({ className = '' }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true" focusable="false">
      <rect width="32" height="32" rx="7" fill="#124452" />
      <path d="M6 19c3-3 6-3 10 0s7 3 10 0v5a2 2 0 0 1-2 2H8a2 2 0 0 1-2-2z" fill="#3fb8af" />
      <circle cx="21" cy="11" r="2.5" fill="none" stroke="#e8f4f2" strokeWidth="1.6" />
      <circle cx="14" cy="8" r="1.5" fill="none" stroke="#e8f4f2" strokeWidth="1.4" />
    </svg>
  );
}
