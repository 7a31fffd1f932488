import type { LivestockGroup } from '@shared/livestock/species';
import type { PhotoRef } from '@shared/schemas/tanks';

/** The animal's latest photo, or a simple drawing of its kind until someone takes one. */
export function LivestockPicture({
  photo,
  group,
  alt,
}: {
  photo: PhotoRef | undefined;
  group: LivestockGroup;
  alt: string;
}) {
  if (photo) {
    return (
      <img
        src={photo.thumbnailUrl}
        alt={alt}
        width={photo.width}
        height={photo.height}
        loading="lazy"
        decoding="async"
        className="block h-full w-full bg-ink-100 object-cover"
      />
    );
  }
  return (
    <div className="flex h-full w-full items-center justify-center bg-gradient-to-b from-brine-100 to-ink-100 text-ink-500">
      <svg viewBox="0 0 48 32" className="h-12 w-16" aria-hidden="true" focusable="false">
        {group === 'fish' ? (
          <path d="M4 16c8-10 22-10 30 0-8 10-22 10-30 0zm30 0 10-7v14z" fill="currentColor" />
        ) : group === 'plant' ? (
          <path
            d="M24 30C22 20 16 12 8 8c8 0 14 6 16 14 2-10 8-16 16-18-8 6-12 14-16 26z"
            fill="currentColor"
          />
        ) : (
          <path
            d="M24 30V14M24 18l-8-8M24 18l8-8M24 22l-10-4M24 22l10-4"
            stroke="currentColor"
            strokeWidth="3"
            strokeLinecap="round"
            fill="none"
          />
        )}
      </svg>
    </div>
  );
}
