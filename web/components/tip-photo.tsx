import { photoUrls } from '@shared/photos/urls';

/**
 * A care tip's photo as its readers see it: the thumbnail, opening the full photo. The owners' feed,
 * the tip's page for staff and the tank's timeline all show it, so it lives here.
 */
export function TipPhoto({
  photoId,
  title,
  className = '',
}: {
  photoId: string;
  /** The tip's title, which is what the photo illustrates. */
  title: string;
  className?: string;
}) {
  const { url, thumbnailUrl } = photoUrls(photoId);
  return (
    <a
      href={url}
      target="_blank"
      rel="noreferrer"
      className={`block w-full max-w-sm overflow-hidden rounded-lg bg-ink-100 hover:opacity-90 ${className}`}
    >
      <img
        src={thumbnailUrl}
        alt={title}
        loading="lazy"
        decoding="async"
        className="aspect-[4/3] w-full object-cover"
      />
      <span className="sr-only"> (full-size photo, opens in a new tab)</span>
    </a>
  );
}
