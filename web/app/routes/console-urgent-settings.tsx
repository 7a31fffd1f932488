import { Link } from 'react-router';
import { Page } from '../../components/page';
import { UrgentSettingsEditor } from '../../features/urgent/components/urgent-settings-form';

export function ConsoleUrgentSettingsRoute() {
  return (
    <Page
      title="Urgent visit settings"
      description="How fast you aim to answer, and the first aid owners read while they wait."
      actions={
        <Link
          to="/console/urgent"
          className="inline-flex min-h-11 items-center rounded-lg border border-ink-300 bg-white px-4 font-bold text-ink-900 no-underline hover:bg-ink-50"
        >
          Urgent requests
        </Link>
      }
    >
      <title>Urgent visit settings — Brinewatch</title>
      <div className="max-w-4xl">
        <UrgentSettingsEditor />
      </div>
    </Page>
  );
}
