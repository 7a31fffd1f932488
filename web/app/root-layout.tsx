import { Link, NavLink, Outlet, useNavigation } from 'react-router';
import { BrandMark } from '../components/brand-mark';
import { can, useMe } from '../lib/auth';
import { UserMenu } from '../features/auth/components/user-menu';
import { NotificationBell } from '../features/notifications/components/notification-bell';
import { useLiveEvents } from '../features/notifications/live-events';

const navLinkClass = ({ isActive }: { isActive: boolean }) =>
  `inline-flex min-h-11 items-center rounded-md px-3 text-sm font-bold no-underline transition-colors ${
    isActive ? 'bg-ink-800 text-white' : 'text-ink-100 hover:bg-ink-800 hover:text-white'
  }`;

function MainNav() {
  const { data: me } = useMe();
  const links: { to: string; label: string; end?: boolean }[] = [];
  // Staff work from the company console; a client sees their own tanks.
  if (can(me, 'clients:read')) {
    links.push({ to: '/console', label: 'Tanks', end: true }, { to: '/console/clients', label: 'Clients' });
    links.push({ to: '/console/alerts', label: 'Alerts' });
    if (can(me, 'staff:read')) links.push({ to: '/console/staff', label: 'Staff' });
    if (can(me, 'audit:read')) links.push({ to: '/console/audit', label: 'Audit trail' });
  } else if (me) links.push({ to: '/tanks', label: 'My tanks' });
  links.push({ to: '/calculators', label: 'Calculators' });
  return (
    <nav
      aria-label="Main"
      className="order-3 -mx-1 flex w-full flex-wrap items-center gap-1 sm:order-none sm:w-auto sm:flex-1"
    >
      {links.map((link) => (
        <NavLink key={link.to} to={link.to} end={link.end} className={navLinkClass}>
          {link.label}
        </NavLink>
      ))}
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
        <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-x-6 gap-y-2 px-4 py-3">
          <Link to="/" className="flex items-center gap-2 text-white no-underline">
            <BrandMark className="h-8 w-8" />
            <span className="text-lg font-bold tracking-tight">Brinewatch</span>
          </Link>
          <MainNav />
          {/* On a phone the bell joins the brand's row; the user menu wraps below as before. */}
          <div className="contents sm:flex sm:items-center sm:gap-2">
            <NotificationBell />
            <UserMenu />
          </div>
        </div>
        {navigation.state === 'loading' && (
          <div className="h-0.5 animate-pulse bg-brine-300" role="progressbar" aria-label="Loading page" />
        )}
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
