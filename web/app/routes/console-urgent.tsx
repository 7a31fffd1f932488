import { Link, useSearchParams } from 'react-router';
import { Page } from '../../components/page';
import { can, useMe } from '../../lib/auth';
import { UrgentBoard } from '../../features/urgent/components/urgent-board';

const tabClass = (active: boolean) =>
  `inline-flex min-h-11 items-center rounded-lg border-2 px-4 font-bold no-underline ${
    active
      ? 'border-ink-800 bg-ink-800 text-white'
      : 'border-ink-300 bg-white text-ink-900 hover:border-ink-700'
  }`;

export function ConsoleUrgentRoute() {
  const [params] = useSearchParams();
  const { data: me } = useMe();
  const state = params.get('state') === 'closed' ? 'closed' : 'open';
  return (
    <Page
      title="Urgent requests"
      description="Open requests, oldest first, each with how long it waited against the company’s target for acknowledging it."
      actions={
        can(me, 'urgent:settings') ? (
          <Link
            to="/console/urgent/settings"
            className="inline-flex min-h-11 items-center rounded-lg border border-ink-300 bg-white px-4 font-bold text-ink-900 no-underline hover:bg-ink-50"
          >
            Settings and first aid
          </Link>
        ) : undefined
      }
    >
      <title>Urgent requests — Brinewatch</title>
      <nav aria-label="Open or closed" className="mb-4">
        <ul className="flex flex-wrap gap-2">
          <li>
            <Link
              to="/console/urgent"
              replace
              className={tabClass(state === 'open')}
              aria-current={state === 'open' ? 'page' : undefined}
            >
              Open
            </Link>
          </li>
          <li>
            <Link
              to="/console/urgent?state=closed"
              replace
              className={tabClass(state === 'closed')}
              aria-current={state === 'closed' ? 'page' : undefined}
            >
              Closed
            </Link>
          </li>
        </ul>
      </nav>
      <UrgentBoard key={state} state={state} />
    </Page>
  );
}
