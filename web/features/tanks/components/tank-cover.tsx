import type { PhotoRef } from '@shared/schemas/tanks';

/** A tank's photo, or a calm drawn stand-in until the company adds one. */
export function TankCover({
  photo,
  size = 'thumbnail',
  alt = '',
  className = '',
}: {
  photo: PhotoRef | null;
  size?: 'thumbnail' | 'full';
  alt?: string;
  className?: string;
}) {
  if (photo) {
    return (
      <img
        src={size === 'full' ? photo.url : photo.thumbnailUrl}
        alt={alt}
        width={photo.width}
        height={photo.height}
        loading="lazy"
        decoding="async"
        className={`block h-full w-full bg-ink-100 object-cover ${className}`}
      />
    );
  }
  return (
    <div
      className={`flex h-full w-full items-center justify-center bg-gradient-to-b from-brine-100 to-ink-100 ${className}`}
      role={alt ? 'img' : undefined}
      aria-label={alt || undefined}
    >
      <svg viewBox="0 0 64 40" className="h-12 w-20 text-ink-500" aria-hidden="true" focusable="false">
        <rect x="2" y="2" width="60" height="32" rx="4" fill="none" stroke="currentColor" strokeWidth="3" />
        <path d="M6 26c6-5 12-5 18 0s12 5 18 0 10-4 16 0" fill="none" stroke="currentColor" strokeWidth="3" />
        <rect x="8" y="35" width="48" height="4" rx="2" fill="currentColor" />
      </svg>
    </div>
  );
}
