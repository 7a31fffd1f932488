import { useEffect, useId, useRef, useState, type CSSProperties } from 'react';
import { Link } from 'react-router';
import type { NotificationView } from '@shared/schemas/alerts';
import { SeverityBadge } from '../../../components/alert-badges';
import { FieldError } from '../../../components/field-error';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { problemMessage } from '../../../lib/problem-message';
import { useMe } from '../../../lib/auth';
import { formatDateTime, relativeTime, useNow } from '../../../lib/format';
import { useNotifications } from '../api/list-notifications';
import { useMarkNotificationsRead } from '../api/mark-notifications-read';

function BellIcon() {
  return (
    <svg viewBox="0 0 24 24" className="h-6 w-6" aria-hidden="true" focusable="false">
      <path
        d="M12 3.5a5.5 5.5 0 0 0-5.5 5.5v3.2c0 .9-.3 1.8-.9 2.5L4.5 16h15l-1.1-1.3a3.9 3.9 0 0 1-.9-2.5V9A5.5 5.5 0 0 0 12 3.5Z"
        fill="none"
        stroke="currentColor"
        strokeWidth="1.8"
        strokeLinejoin="round"
      />
      <path d="M9.5 18.5a2.5 2.5 0 0 0 5 0" fill="none" stroke="currentColor" strokeWidth="1.8" />
    </svg>
  );
}

function NotificationItem({
  item,
  now,
  onOpen,
}: {
  item: NotificationView;
  now: number;
  onOpen: (item: NotificationView) => void;
}) {
  const unread = item.readAt === null;
  return (
    <li>
      <Link
        to={item.link}
        onClick={() => onOpen(item)}
        className={`block px-4 py-3 text-ink-950 no-underline hover:bg-ink-50 ${unread ? 'bg-brine-100/40' : ''}`}
      >
        <span className="flex flex-wrap items-center gap-2">
          <SeverityBadge severity={item.severity} />
          {unread && (
            <span className="inline-flex items-center gap-1 text-sm font-bold text-brine-700">
              <span aria-hidden="true" className="h-2 w-2 rounded-full bg-current" />
              Unread
            </span>
          )}
        </span>
        <span className={`mt-1 block text-ink-900 ${unread ? 'font-bold' : ''}`}>{item.title}</span>
        <span className="mt-0.5 line-clamp-3 text-sm text-ink-700">{item.body}</span>
        <time
          dateTime={item.createdAt}
          title={formatDateTime(item.createdAt)}
          className="mt-1 block text-xs text-ink-600"
        >
          {relativeTime(item.createdAt, now)}
        </time>
      </Link>
    </li>
  );
}

/**
 * The bell in the header and its panel: the latest notifications, newest first. The panel is a
 * modal dialog (a sheet on a phone, a drop-down beside the bell on a wider screen), so Escape closes
 * it and focus goes back to the bell.
 */
function NotificationCentre() {
  const inbox = useNotifications();
  const markRead = useMarkNotificationsRead();
  const now = useNow();
  const [open, setOpen] = useState(false);
  const [anchor, setAnchor] = useState({ top: 0, right: 0 });
  const dialogRef = useRef<HTMLDialogElement>(null);
  const buttonRef = useRef<HTMLButtonElement>(null);
  const id = useId();
  const unread = inbox.data?.unread ?? 0;

  // A click on the backdrop lands on the dialog itself (clicks inside land on its content); the
  // keyboard's way out is Escape, which the dialog handles natively.
  useEffect(() => {
    const dialog = dialogRef.current;
    if (!dialog) return;
    const onClick = (event: MouseEvent) => {
      if (event.target === dialog) dialog.close();
    };
    dialog.addEventListener('click', onClick);
    return () => dialog.removeEventListener('click', onClick);
  }, []);

  const show = () => {
    const rect = buttonRef.current?.getBoundingClientRect();
    if (rect) setAnchor({ top: rect.bottom + 8, right: Math.max(8, window.innerWidth - rect.right) });
    dialogRef.current?.showModal();
    setOpen(true);
    void inbox.refetch();
  };
  const close = () => dialogRef.current?.close();

  const openItem = (item: NotificationView) => {
    if (item.readAt === null) markRead.mutate([item.id]);
    close();
  };

  const position = {
    '--panel-top': `${anchor.top}px`,
    '--panel-right': `${anchor.right}px`,
  } as CSSProperties;

  return (
    <>
      <button
        ref={buttonRef}
        type="button"
        onClick={show}
        aria-haspopup="dialog"
        aria-expanded={open}
        aria-controls={`${id}-panel`}
        aria-label={unread > 0 ? `Notifications, ${unread} unread` : 'Notifications'}
        className="relative inline-flex h-11 w-11 shrink-0 items-center justify-center rounded-lg text-white hover:bg-ink-800"
      >
        <BellIcon />
        {unread > 0 && (
          <span
            aria-hidden="true"
            className="absolute -right-0.5 -top-0.5 flex h-5 min-w-5 items-center justify-center rounded-full bg-brine-300 px-1 text-xs font-bold text-ink-950"
          >
            {unread > 99 ? '99+' : unread}
          </span>
        )}
      </button>
      <dialog
        ref={dialogRef}
        id={`${id}-panel`}
        aria-labelledby={`${id}-title`}
        onClose={() => setOpen(false)}
        style={position}
        className="fixed inset-0 m-0 h-dvh max-h-dvh w-full max-w-full bg-white p-0 text-ink-950 backdrop:bg-ink-950/40 sm:inset-auto sm:right-(--panel-right) sm:top-(--panel-top) sm:h-auto sm:max-h-[calc(100dvh-var(--panel-top)-1rem)] sm:w-[26rem] sm:rounded-card sm:shadow-card sm:backdrop:bg-ink-950/10"
      >
        <div className="flex h-full max-h-[inherit] flex-col">
          <div className="flex items-center justify-between gap-3 border-b border-ink-100 px-4 py-3">
            <div>
              <h2 id={`${id}-title`} className="text-lg font-bold text-ink-900">
                Notifications
              </h2>
              <p className="text-sm text-ink-700">{unread === 0 ? 'All read' : `${unread} unread`}</p>
            </div>
            <div className="flex items-center gap-2">
              <button
                type="button"
                onClick={() => markRead.mutate(undefined)}
                disabled={unread === 0 || markRead.isPending}
                className="min-h-11 rounded-lg px-3 text-sm font-bold text-brine-700 hover:bg-ink-50 disabled:text-ink-500"
              >
                {markRead.isPending ? 'Marking…' : 'Mark all as read'}
              </button>
              <button
                type="button"
                onClick={close}
                className="min-h-11 rounded-lg border border-ink-300 px-3 text-sm font-bold text-ink-900 hover:bg-ink-50"
              >
                Close
              </button>
            </div>
          </div>
          {markRead.isError && (
            <div role="alert" className="px-4">
              <FieldError>{problemMessage(markRead.error)}</FieldError>
            </div>
          )}
          <div className="min-h-0 flex-1 overflow-y-auto">
            {inbox.isPending ? (
              <div className="p-4">
                <LoadingState label="Loading notifications…" />
              </div>
            ) : inbox.isError ? (
              <div className="p-4">
                <ErrorState
                  error={inbox.error}
                  what="your notifications"
                  onRetry={() => void inbox.refetch()}
                />
              </div>
            ) : inbox.data.items.length === 0 ? (
              <div className="p-4">
                <EmptyState title="Nothing yet">
                  When a reading in one of your tanks crosses a limit, you hear about it here.
                </EmptyState>
              </div>
            ) : (
              <ul className="divide-y divide-ink-100" aria-label="Latest notifications">
                {inbox.data.items.map((item) => (
                  <NotificationItem key={item.id} item={item} now={now} onOpen={openItem} />
                ))}
              </ul>
            )}
          </div>
          <div className="border-t border-ink-100 px-4 py-2">
            <Link
              to="/settings/notifications"
              onClick={close}
              className="inline-flex min-h-11 items-center font-bold text-brine-700"
            >
              Notification settings
            </Link>
          </div>
        </div>
      </dialog>
    </>
  );
}

/** Only for someone signed in; nothing at all otherwise. */
export function NotificationBell() {
  const { data: me } = useMe();
  return me ? <NotificationCentre /> : null;
}
