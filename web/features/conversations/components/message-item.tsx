import { Link } from 'react-router';
import type { MessageView } from '@shared/schemas/conversations';
import { formatDateTime, formatTime } from '../../../lib/format';
import { MessageBody } from './message-body';

function LockIcon() {
  return (
    <svg viewBox="0 0 20 20" className="h-4 w-4" aria-hidden="true" focusable="false">
      <rect x="4" y="9" width="12" height="8" rx="1.5" fill="none" stroke="currentColor" strokeWidth="1.8" />
      <path d="M7 9V6.5a3 3 0 0 1 6 0V9" fill="none" stroke="currentColor" strokeWidth="1.8" />
    </svg>
  );
}

const sideWords = { owner: 'Owner', staff: 'Staff' } as const;

/**
 * One line of the conversation. My own lines sit on the right and say "You"; an internal note is
 * labelled as one, on a dashed amber card with a lock, so it never passes for a message owners read.
 */
export function MessageItem({
  message,
  own,
  timeZone,
  urgentRequestId,
}: {
  message: MessageView;
  own: boolean;
  timeZone: string | undefined;
  /** The urgent request this thread is shown beside, if any: its lines say "this request". */
  urgentRequestId?: string;
}) {
  const note = message.kind === 'internal-note';
  const author = own ? 'You' : message.author.name;
  const frame = note
    ? 'border-2 border-dashed border-watch-700 bg-watch-100'
    : own
      ? 'border border-brine-300 bg-brine-100'
      : 'border border-ink-100 bg-white';
  return (
    <article
      aria-label={`${note ? 'Internal note' : 'Message'} from ${author}`}
      className={`w-fit max-w-[min(40rem,88%)] min-w-0 rounded-card px-3 py-2 shadow-card sm:px-4 ${frame} ${
        own ? 'ml-auto' : 'mr-auto'
      }`}
    >
      {note && (
        <p className="mb-1 flex items-center gap-1.5 text-sm font-bold text-watch-700">
          <LockIcon />
          Internal note — staff only
        </p>
      )}
      <p className="flex flex-wrap items-baseline gap-x-2 text-sm">
        <span className="font-bold text-ink-900">{author}</span>
        {!own && <span className="text-ink-700">{sideWords[message.author.side]}</span>}
        <time
          dateTime={message.createdAt}
          title={formatDateTime(message.createdAt, timeZone)}
          className="text-ink-700"
        >
          {formatTime(message.createdAt, timeZone)}
        </time>
      </p>
      {message.urgentRequestId &&
        (message.urgentRequestId === urgentRequestId ? (
          <p className="mt-1 text-sm font-bold text-alert-700">About this urgent request</p>
        ) : (
          <p className="mt-1 text-sm">
            <Link to={`/urgent/${message.urgentRequestId}`} className="font-bold text-alert-700 underline">
              About an urgent visit request
            </Link>
          </p>
        ))}
      <div className="mt-1">
        <MessageBody text={message.body} />
      </div>
      {message.photos.length > 0 && (
        <ul className="mt-2 grid grid-cols-3 gap-1.5 sm:w-80" aria-label="Photos">
          {message.photos.map((photo, index) => (
            <li key={photo.id}>
              <a
                href={photo.url}
                target="_blank"
                rel="noopener noreferrer"
                className="block overflow-hidden rounded-lg bg-ink-100 hover:opacity-90"
              >
                <img
                  src={photo.thumbnailUrl}
                  alt={`Attachment ${index + 1} of ${message.photos.length} from ${author}`}
                  loading="lazy"
                  decoding="async"
                  className="aspect-square w-full object-cover"
                />
                <span className="sr-only"> (full size, opens in a new tab)</span>
              </a>
            </li>
          ))}
        </ul>
      )}
    </article>
  );
}
