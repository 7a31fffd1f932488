import { useQuery } from '@tanstack/react-query';
import { NavLink } from 'react-router';
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

/** Where "Messages" leads: staff to their inbox; an owner of one tank to its conversation, else to their tanks. */
function useMessagesHref(isStaff: boolean): string {
  // Only an owner's link depends on the tanks; staff would load the whole company's list for nothing.
  const tanks = useQuery({ ...tanksQueryOptions(), enabled: !isStaff });
  if (isStaff) return '/console/inbox';
  const mine = tanks.data ?? [];
  return mine.length === 1 ? `/tanks/${mine[0]!.id}/messages` : '/tanks';
}

function MessagesLinkFor({ isStaff }: { isStaff: boolean }) {
  const unread = useUnreadCounts();
  const href = useMessagesHref(isStaff);
  const count = unread.data?.total ?? 0;
  return (
    <NavLink
      to={href}
      end
      aria-label={count > 0 ? `Messages, ${formatCount(count)} unread` : 'Messages'}
      // An owner of several tanks is led to their tanks, where each card says what is unread: that
      // page is "My tanks", not this button's own.
      aria-current={href === '/tanks' ? false : undefined}
      className={({ isActive }) =>
        `relative inline-flex h-11 w-11 shrink-0 items-center justify-center rounded-lg text-white hover:bg-ink-800 ${
          isActive && href !== '/tanks' ? 'bg-ink-800' : ''
        }`
      }
    >
      <ChatIcon />
      {count > 0 && (
        <span
          aria-hidden="true"
          className="absolute -right-0.5 -top-0.5 flex h-5 min-w-5 items-center justify-center rounded-full bg-brine-300 px-1 text-xs font-bold text-ink-950"
        >
          {count > 99 ? '99+' : count}
        </span>
      )}
    </NavLink>
  );
}

/** "Messages" in the header, with the unread count; only for someone signed in. */
export function MessagesLink() {
  const { data: me } = useMe();
  if (!me) return null;
  return <MessagesLinkFor isStaff={can(me, 'conversations:inbox')} />;
}
