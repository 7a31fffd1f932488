import { Link } from 'react-router';
import { formatCount } from '../../../lib/format';
import { useConversation } from '../api/get-conversation';

/** The tank page's way into its conversation, with how many lines wait unread. */
export function TankMessagesLink({ tankId, className = '' }: { tankId: string; className?: string }) {
  const conversation = useConversation(tankId);
  const unread = conversation.data?.unread ?? 0;
  return (
    <Link
      to={`/tanks/${tankId}/messages`}
      className={`inline-flex min-h-11 items-center gap-2 rounded-lg border border-ink-300 bg-white px-4 font-bold text-ink-900 no-underline hover:bg-ink-50 ${className}`}
    >
      Messages{' '}
      {unread > 0 && (
        <span className="inline-flex min-w-6 items-center justify-center rounded-full bg-brine-700 px-1.5 text-sm text-white">
          {formatCount(unread)}
          <span className="sr-only"> unread</span>
        </span>
      )}
    </Link>
  );
}

/**
 * A tank card's line about its conversation (on the owner's dashboard): shown only when something
 * waits unread. It sits above the card's own link, so it can be tapped on its own.
 */
export function TankUnreadLine({ tankId, unread }: { tankId: string; unread: number }) {
  if (unread <= 0) return null;
  return (
    <p className="relative z-10 text-sm">
      <Link
        to={`/tanks/${tankId}/messages`}
        className="inline-flex min-h-11 items-center gap-2 font-bold text-brine-700 underline"
      >
        <span className="inline-flex min-w-6 items-center justify-center rounded-full bg-brine-700 px-1.5 text-white no-underline">
          {formatCount(unread)}
        </span>{' '}
        {unread === 1 ? 'new message' : 'new messages'}
      </Link>
    </p>
  );
}
