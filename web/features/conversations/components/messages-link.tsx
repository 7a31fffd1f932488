import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { NavLink } from 'react-router';
import { TankChoiceSheet } from '../../../components/tank-choice-sheet';
import { can, useMe } from '../../../lib/auth';
import { formatCount } from '../../../lib/format';
import { tanksQueryOptions } from '../../../lib/queries/tanks';
import { useUnreadCounts } from '../api/get-unread';

function ChatIcon() {
  return (
    <svg viewBox="0 0 24 24" className="h-6 w-6" aria-hidden="true" focusable="false">
      <path
        d="M4.5 5.5h15a1 1 0 0 1 1 1v9a1 1 0 0 1-1 1H10l-4.5 3.5v-3.5h-1a1 1 0 0 1-1-1v-9a1 1 0 0 1 1-1Z"
        fill="none"
        stroke="currentColor"
        strokeWidth="1.8"
        strokeLinejoin="round"
      />
      <path d="M8 10h8M8 13h5" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />
    </svg>
  );
}

const buttonClass =
  'relative inline-flex h-11 w-11 shrink-0 items-center justify-center rounded-lg text-white hover:bg-ink-800';

function UnreadDot({ count }: { count: number }) {
  if (count <= 0) return null;
  return (
    <span
      aria-hidden="true"
      className="absolute -right-0.5 -top-0.5 flex h-5 min-w-5 items-center justify-center rounded-full bg-brine-300 px-1 text-xs font-bold text-ink-950"
    >
      {count > 99 ? '99+' : count}
    </span>
  );
}

const labelFor = (count: number) => (count > 0 ? `Messages, ${formatCount(count)} unread` : 'Messages');

/**
 * An owner of several tanks has a conversation per tank: the button asks which, each tank with
 * its unread count, rather than leading somewhere that is not about messages.
 */
function ChooseConversation({
  tanks,
  unread,
}: {
  tanks: readonly { id: string; name: string }[];
  unread: { total: number; byTank: Record<string, number> } | undefined;
}) {
  const [asking, setAsking] = useState(false);
  const total = unread?.total ?? 0;
  return (
    <>
      <button
        type="button"
        aria-label={labelFor(total)}
        aria-haspopup="dialog"
        className={buttonClass}
        onClick={() => setAsking(true)}
      >
        <ChatIcon />
        <UnreadDot count={total} />
      </button>
      {asking && (
        <TankChoiceSheet
          title="Which tank's conversation?"
          tanks={tanks}
          hrefOf={(tank) => `/tanks/${tank.id}/messages`}
          asideOf={(tank) => {
            const count = unread?.byTank[tank.id] ?? 0;
            return count > 0 ? `${formatCount(count)} unread` : 'no new messages';
          }}
          onClose={() => setAsking(false)}
        />
      )}
    </>
  );
}

/** "Messages" for staff (their inbox) and for an owner of one tank (its conversation). */
function MessagesLinkTo({ href, count }: { href: string; count: number }) {
  return (
    <NavLink
      to={href}
      end
      aria-label={labelFor(count)}
      // Before an owner's tanks have loaded it leads to them; that page is "My tanks", not this one.
      aria-current={href === '/tanks' ? false : undefined}
      className={({ isActive }) => `${buttonClass} ${isActive && href !== '/tanks' ? 'bg-ink-800' : ''}`}
    >
      <ChatIcon />
      <UnreadDot count={count} />
    </NavLink>
  );
}

function MessagesLinkFor({ isStaff }: { isStaff: boolean }) {
  const unread = useUnreadCounts();
  // Only an owner's button depends on the tanks; staff would load the whole company's list for nothing.
  const tanks = useQuery({ ...tanksQueryOptions(), enabled: !isStaff });
  const count = unread.data?.total ?? 0;
  if (isStaff) return <MessagesLinkTo href="/console/inbox" count={count} />;
  const mine = tanks.data ?? [];
  if (mine.length > 1) return <ChooseConversation tanks={mine} unread={unread.data} />;
  // One tank: straight to its conversation (while the list loads, to the tanks).
  return (
    <MessagesLinkTo href={mine.length === 1 ? `/tanks/${mine[0]!.id}/messages` : '/tanks'} count={count} />
  );
}

/** "Messages" in the header, with the unread count; only for someone signed in. */
export function MessagesLink() {
  const { data: me } = useMe();
  if (!me) return null;
  return <MessagesLinkFor isStaff={can(me, 'conversations:inbox')} />;
}
