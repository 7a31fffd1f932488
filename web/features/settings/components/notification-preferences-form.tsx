import { useId, useMemo, useState, type FormEvent } from 'react';
import { alertSeverities, type AlertSeverity } from '@shared/alerts/kinds';
import { notificationPreferences, type NotificationPreferences } from '@shared/schemas/notifications';
import { Button } from '../../../components/button';
import { FieldError } from '../../../components/form-fields';
import { ApiError } from '../../../lib/api-client';
import { groupIssues, problemMessage } from '../../../lib/form-issues';
import { SeverityBadge } from '../../alerts/components/severity-badge';
import { useSaveNotificationPreferences } from '../api/save-notification-preferences';

type Channel = 'push' | 'email' | 'inApp';

const channels: { key: Channel; label: string }[] = [
  { key: 'push', label: 'Push' },
  { key: 'email', label: 'E-mail' },
  { key: 'inApp', label: 'In the app' },
];

const severityHelp: Record<AlertSeverity, string> = {
  critical: 'A reading past a critical limit. Someone should act now.',
  warning: 'A reading past a warning limit, a reading changing fast, or a device gone quiet.',
  notice: 'Low urgency: a home test that is due, or a reading back within its limits.',
};

const fields = ['quietHours.start', 'quietHours.end', 'timeZone'] as const;
type Field = (typeof fields)[number];

const inputClass = (invalid: boolean) =>
  `mt-1 min-h-12 w-full min-w-0 rounded-lg border-2 bg-white px-3 text-base text-ink-950 ${
    invalid ? 'border-alert-700' : 'border-ink-300 focus:border-ink-700'
  }`;

function timeZones(current: string): string[] {
  const zones = Intl.supportedValuesOf('timeZone');
  return zones.includes(current) ? zones : [current, ...zones];
}

const deviceZone = () => Intl.DateTimeFormat().resolvedOptions().timeZone;

/** Which alerts reach this person on which channel, and when to hold the non-critical ones back. */
export function NotificationPreferencesForm({ initial }: { initial: NotificationPreferences }) {
  const [preferences, setPreferences] = useState(initial);
  const [lastQuietHours, setLastQuietHours] = useState(
    initial.quietHours ?? { start: '22:00', end: '07:00' },
  );
  const [errors, setErrors] = useState<Partial<Record<Field, string>>>({});
  const [saved, setSaved] = useState(false);
  const save = useSaveNotificationPreferences();
  const id = useId();
  const zones = useMemo(() => timeZones(preferences.timeZone), [preferences.timeZone]);
  const hereZone = deviceZone();

  const update = (next: NotificationPreferences) => {
    setSaved(false);
    setPreferences(next);
  };

  const toggle = (channel: Channel, severity: AlertSeverity, on: boolean) => {
    const chosen = new Set(preferences[channel]);
    if (on) chosen.add(severity);
    else chosen.delete(severity);
    update({ ...preferences, [channel]: alertSeverities.filter((s) => chosen.has(s)) });
  };

  const setQuiet = (part: 'start' | 'end', value: string) => {
    const quietHours = { ...(preferences.quietHours ?? lastQuietHours), [part]: value };
    setLastQuietHours(quietHours);
    update({ ...preferences, quietHours });
  };

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const checked = notificationPreferences.safeParse(preferences);
    if (!checked.success) {
      setErrors(
        groupIssues(
          checked.error.issues.map((issue) => ({ path: issue.path.join('.'), message: issue.message })),
          fields,
        ).fields,
      );
      return;
    }
    setErrors({});
    save.mutate(checked.data, {
      onSuccess: () => setSaved(true),
      onError: (error) => {
        if (error instanceof ApiError) setErrors(groupIssues(error.issues, fields).fields);
      },
    });
  };

  const criticalNowhere = channels.every((channel) => !preferences[channel.key].includes('critical'));
  const quiet = preferences.quietHours;

  return (
    <form
      noValidate
      onSubmit={submit}
      aria-labelledby={`${id}-title`}
      className="rounded-card bg-white p-4 shadow-card sm:p-6"
    >
      <h2 id={`${id}-title`} className="text-xl font-bold text-ink-900">
        How alerts reach you
      </h2>
      <p className="mt-1 text-sm text-ink-700">
        Push goes to every device where you turned notifications on. E-mail goes to your sign-in address.
      </p>
      <p className="mt-4 flex gap-3 rounded-lg bg-brine-100 p-3 text-ink-900">
        <svg
          viewBox="0 0 12 12"
          className="mt-1 h-3 w-3 shrink-0 text-alert-700"
          aria-hidden="true"
          focusable="false"
        >
          <path d="M6 0.5 11.5 6 6 11.5 0.5 6z" fill="currentColor" />
        </svg>
        <span>
          <strong>Critical alerts always come through</strong>, even during quiet hours, on every channel you
          choose for them.
        </span>
      </p>

      <div className="mt-4 grid gap-4">
        {[...alertSeverities].reverse().map((severity) => (
          <fieldset key={severity} className="rounded-lg border border-ink-100 p-3">
            <legend className="px-1">
              <SeverityBadge severity={severity} />
              <span className="sr-only"> alerts</span>
            </legend>
            <p className="text-sm text-ink-700">{severityHelp[severity]}</p>
            <div className="mt-2 flex flex-wrap gap-1.5 sm:grid sm:grid-cols-3 sm:gap-2">
              {channels.map((channel) => (
                <label
                  key={channel.key}
                  className="flex min-h-11 cursor-pointer items-center gap-1.5 whitespace-nowrap rounded-lg border-2 border-ink-100 px-2 text-sm font-bold text-ink-900 has-[:checked]:border-brine-700 has-[:checked]:bg-brine-100 sm:gap-2 sm:px-3"
                >
                  <input
                    type="checkbox"
                    checked={preferences[channel.key].includes(severity)}
                    onChange={(event) => toggle(channel.key, severity, event.target.checked)}
                    className="h-5 w-5 shrink-0 accent-brine-700"
                  />
                  {channel.label}
                </label>
              ))}
            </div>
          </fieldset>
        ))}
      </div>
      {criticalNowhere && (
        <p className="mt-3 flex gap-2 rounded-lg bg-watch-100 p-3 font-bold text-watch-700">
          <span aria-hidden="true">!</span>
          With every channel off for critical alerts, you would only see them on the tank’s page.
        </p>
      )}

      <fieldset className="mt-6">
        <legend className="text-lg font-bold text-ink-900">Quiet hours</legend>
        <label className="mt-2 flex min-h-11 cursor-pointer items-center gap-3 font-bold text-ink-900">
          <input
            type="checkbox"
            checked={quiet !== null}
            onChange={(event) =>
              update({ ...preferences, quietHours: event.target.checked ? lastQuietHours : null })
            }
            className="h-5 w-5 shrink-0 accent-brine-700"
          />
          Hold back warnings and notices at night
        </label>
        {quiet && (
          <div className="mt-2 grid grid-cols-2 gap-3">
            {(['start', 'end'] as const).map((part) => {
              const field = `quietHours.${part}` as const;
              return (
                <div key={part} className="min-w-0">
                  <label htmlFor={`${id}-${part}`} className="block font-bold text-ink-900">
                    {part === 'start' ? 'From' : 'Until'}
                  </label>
                  <input
                    id={`${id}-${part}`}
                    value={quiet[part]}
                    onChange={(event) => setQuiet(part, event.target.value.trim())}
                    inputMode="numeric"
                    autoComplete="off"
                    placeholder={part === 'start' ? '22:00' : '07:00'}
                    aria-invalid={errors[field] ? true : undefined}
                    aria-describedby={`${id}-clock-hint${errors[field] ? ` ${id}-${part}-error` : ''}`}
                    className={inputClass(Boolean(errors[field]))}
                  />
                  {errors[field] && <FieldError id={`${id}-${part}-error`}>{errors[field]}</FieldError>}
                </div>
              );
            })}
            <p id={`${id}-clock-hint`} className="col-span-2 text-sm text-ink-700">
              On the 24-hour clock, such as 22:00 to 07:00.
            </p>
          </div>
        )}
      </fieldset>

      <div className="mt-6">
        <label htmlFor={`${id}-zone`} className="block text-lg font-bold text-ink-900">
          Time zone
        </label>
        <p id={`${id}-zone-hint`} className="text-sm text-ink-700">
          Quiet hours and the times in your e-mails follow this zone.
        </p>
        <select
          id={`${id}-zone`}
          value={preferences.timeZone}
          onChange={(event) => update({ ...preferences, timeZone: event.target.value })}
          aria-describedby={`${id}-zone-hint${errors.timeZone ? ` ${id}-zone-error` : ''}`}
          aria-invalid={errors.timeZone ? true : undefined}
          className={inputClass(Boolean(errors.timeZone))}
        >
          {zones.map((zone) => (
            <option key={zone} value={zone}>
              {zone.replace(/_/g, ' ')}
            </option>
          ))}
        </select>
        {errors.timeZone && <FieldError id={`${id}-zone-error`}>{errors.timeZone}</FieldError>}
        {hereZone && hereZone !== preferences.timeZone && zones.includes(hereZone) && (
          <button
            type="button"
            onClick={() => update({ ...preferences, timeZone: hereZone })}
            className="mt-2 min-h-11 font-bold text-brine-700 underline"
          >
            Use this device’s zone ({hereZone.replace(/_/g, ' ')})
          </button>
        )}
      </div>

      {save.isError && !(save.error instanceof ApiError && save.error.issues.length > 0) && (
        <div role="alert">
          <FieldError>{problemMessage(save.error)}</FieldError>
        </div>
      )}
      <div className="mt-6 flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? 'Saving…' : 'Save preferences'}
        </Button>
        <p role="status" className="font-bold text-healthy-700">
          {saved ? 'Saved.' : ''}
        </p>
      </div>
    </form>
  );
}
