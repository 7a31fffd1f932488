import { useEffect, useRef } from 'react';
import { Link, NavLink, Outlet, useLocation, useNavigation } from 'react-router';
import { BrandMark } from '../components/brand-mark';
import { OfflineNotice } from '../components/offline-notice';
import { can, useMe } from '../lib/auth';
import { UserMenu } from '../features/auth/components/user-menu';
import { MessagesLink } from '../features/conversations/components/messages-link';
import { NotificationBell } from '../features/notifications/components/notification-bell';
import { useLiveEvents } from '../features/notifications/live-events';
import { useOpenUrgentCount } from '../features/urgent/api/list-urgent-requests';

const navLinkClass = ({ isActive }: { isActive: boolean }) =>
  `inline-flex min-h-11 items-center whitespace-nowrap rounded-md px-3 text-sm font-bold no-underline transition-colors ${
    isActive ? 'bg-ink-800 text-white' : 'text-ink-100 hover:bg-ink-800 hover:text-white'
  }`;

/**
 * One row of links. On a phone the row scrolls sideways inside the header (never the page), so
 * the header stays one line tall and the current page's link is scrolled into view.
 */
function MainNav() {
  const { data: me } = useMe();
  const { pathname } = useLocation();
  const navRef = useRef<HTMLElement>(null);
  const openUrgent = useOpenUrgentCount(can(me, 'urgent:manage'));
  // Again once the links appear (they wait for who is signed in), once a count widens a link and
  // once the web font has replaced the fallback, so a page opened directly or reloaded shows its
  // own link too.
  const signedIn = me?.id ?? null;
  useEffect(() => {
    let live = true;
    const reveal = () => {
      if (!live) return;
      navRef.current
        ?.querySelector('[aria-current="page"]')
        ?.scrollIntoView({ block: 'nearest', inline: 'nearest' });
    };
    reveal();
    void document.fonts?.ready.then(reveal);
    return () => {
      live = false;
    };
  }, [pathname, signedIn, openUrgent]);
  const links: { to: string; label: string; end?: boolean; count?: number | null }[] = [];
  const isStaffNav = can(me, 'clients:read');
  // Staff work from the company console; a client sees their own tanks.
  if (can(me, 'clients:read')) {
    links.push({ to: '/console', label: 'Tanks', end: true });
    // The inbox is the Messages button beside the notifications, with its unread count.
    // Early in the row, so a phone shows it without scrolling the row.
    if (can(me, 'urgent:manage')) links.push({ to: '/console/urgent', label: 'Urgent', count: openUrgent });
    if (can(me, 'visits:write')) links.push({ to: '/console/schedule', label: 'Schedule' });
    if (can(me, 'care-tips:write')) links.push({ to: '/console/tips', label: 'Care tips' });
    links.push({ to: '/console/clients', label: 'Clients' });
    links.push({ to: '/console/alerts', label: 'Alerts' });
    if (can(me, 'invoices:read')) links.push({ to: '/console/invoices', label: 'Invoices' });
    if (can(me, 'staff:read')) links.push({ to: '/console/staff', label: 'Staff' });
    if (can(me, 'billing:manage')) links.push({ to: '/console/billing', label: 'Price list' });
    if (can(me, 'audit:read')) links.push({ to: '/console/audit', label: 'Audit trail' });
  } else if (me) {
    links.push({ to: '/tanks', label: 'My tanks' });
    if (can(me, 'invoices:pay')) links.push({ to: '/invoices', label: 'Invoices' });
  }
  links.push({ to: '/calculators', label: 'Calculators' });
  return (
    <nav
      ref={navRef}
      aria-label="Main"
      // Staff have a dozen destinations: they get a row of their own under the brand and the
      // buttons, at every width, rather than a row that hides its last links; so does everyone on
      // a phone, where the buttons leave no room beside them.
      className={
        isStaffNav
          ? 'order-last -mx-1 basis-full overflow-x-auto px-1'
          : me
            ? 'order-last -mx-1 basis-full overflow-x-auto px-1 sm:order-none sm:mx-0 sm:min-w-0 sm:flex-1 sm:basis-auto sm:px-0'
            : 'min-w-0 flex-1 overflow-x-auto'
      }
    >
      <ul className="flex w-max items-center gap-1">
        {links.map((link) => (
          <li key={link.to}>
            <NavLink to={link.to} end={link.end} className={navLinkClass}>
              {link.label}
              {link.count ? (
                <span className="ml-1.5 rounded-full bg-alert-700 px-2 py-0.5 text-xs text-white">
                  {link.count}
                  <span className="sr-only"> open</span>
                </span>
              ) : null}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}

export function RootLayout() {
  const navigation = useNavigation();
  useLiveEvents();
  return (
    <div className="flex min-h-dvh flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-white focus:px-3 focus:py-2"
      >
        Skip to content
      </a>
      <header className="bg-ink-900 text-white">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-2 gap-y-1 px-4 py-2 sm:gap-x-6 sm:py-3">
          <Link to="/" className="flex min-h-11 shrink-0 items-center gap-2 text-white no-underline">
            <BrandMark className="h-8 w-8" />
            {/* On a phone the mark alone; screen readers still hear the name. */}
            <span className="sr-only text-lg font-bold tracking-tight sm:not-sr-only">Brinewatch</span>
          </Link>
          <MainNav />
          <div className="ml-auto flex shrink-0 items-center gap-1 sm:gap-2">
            <MessagesLink />
            <NotificationBell />
            <UserMenu />
          </div>
        </div>
        {navigation.state === 'loading' && (
          <div className="h-0.5 animate-pulse bg-brine-300" role="progressbar" aria-label="Loading page" />
        )}
        <OfflineNotice />
      </header>
      <main id="main" className="flex-1">
        <Outlet />
      </main>
      <footer className="border-t border-ink-100 bg-white">
        <div className="mx-auto flex max-w-6xl flex-col gap-2 px-4 py-6 text-sm text-ink-700 sm:flex-row sm:justify-between">
          <p>Brinewatch — tank health between visits.</p>
          <p>
            Advice here is general. Electrical work near water is for a licensed electrician under local
            codes.
          </p>
        </div>
      </footer>
    </div>
  );
}
