import { useEffect, useId, useMemo, useState } from 'react';
import { useController, useWatch } from 'react-hook-form';
import { z } from 'zod';
import { alertSeverities, type AlertSeverity } from '@shared/alerts/kinds';
import { notificationPreferences, type NotificationPreferences } from '@shared/schemas/notifications';
import { SeverityBadge } from '../../../components/alert-badges';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { CheckboxField, CheckboxGroupField, SelectField, TextField } from '../../../components/form-fields';
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

/*
 * The form keeps the quiet hours while they are switched off (`holdBack`), so switching them back
 * on brings the last times back; only when they are on are the times checked and sent.
 */
const { push, email, inApp, timeZone } = notificationPreferences.shape;
const visitReports = notificationPreferences.shape.visitReports.unwrap();
const careTips = notificationPreferences.shape.careTips.unwrap();
const messages = notificationPreferences.shape.messages.unwrap();
const urgentUpdates = notificationPreferences.shape.urgentUpdates.unwrap();
const clockTimes = notificationPreferences.shape.quietHours.unwrap().shape;
const choices = { push, email, inApp, timeZone, visitReports, careTips, messages, urgentUpdates };
const preferencesForm = z
  .discriminatedUnion('holdBack', [
    z.object({
      ...choices,
      holdBack: z.literal(true),
      quietHours: z.object({
        start: z.string().trim().pipe(clockTimes.start),
        end: z.string().trim().pipe(clockTimes.end),
      }),
    }),
    z.object({
      ...choices,
      holdBack: z.literal(false),
      quietHours: z.object({ start: z.string(), end: z.string() }),
    }),
  ])
  .transform(({ holdBack, quietHours, ...rest }): NotificationPreferences => ({
    ...rest,
    quietHours: holdBack ? quietHours : null,
  }));
type PreferencesFormValues = z.input<typeof preferencesForm>;

/** The channels a piece of news (a report, a message, a request's change, a tip) can take. */
const newsChannels = [
  { value: 'push', label: 'Push' },
  { value: 'email', label: 'E-mail' },
  { value: 'in-app', label: 'In the app' },
] as const;

const formValues = (preferences: NotificationPreferences): PreferencesFormValues => ({
  push: preferences.push,
  email: preferences.email,
  inApp: preferences.inApp,
  timeZone: preferences.timeZone,
  visitReports: preferences.visitReports,
  careTips: preferences.careTips,
  messages: preferences.messages,
  urgentUpdates: preferences.urgentUpdates,
  holdBack: preferences.quietHours !== null,
  quietHours: preferences.quietHours ?? { start: '22:00', end: '07:00' },
});

function timeZones(current: string): string[] {
  const zones = Intl.supportedValuesOf('timeZone');
  return zones.includes(current) ? zones : [current, ...zones];
}

const deviceZone = () => Intl.DateTimeFormat().resolvedOptions().timeZone;

/** One severity on one channel: a tick in that channel's list of severities. */
function ChannelChoice({
  channel,
  severity,
  label,
}: {
  channel: Channel;
  severity: AlertSeverity;
  label: string;
}) {
  const { field } = useController<PreferencesFormValues, Channel>({ name: channel });
  const chosen = field.value;
  return (
    <label className="flex min-h-11 cursor-pointer items-center gap-1.5 whitespace-nowrap rounded-lg border-2 border-ink-100 px-2 text-sm font-bold text-ink-900 has-[:checked]:border-brine-700 has-[:checked]:bg-brine-100 sm:gap-2 sm:px-3">
      <input
        type="checkbox"
        checked={chosen.includes(severity)}
        onChange={(event) =>
          field.onChange(
            alertSeverities.filter((s) => (s === severity ? event.target.checked : chosen.includes(s))),
          )
        }
        onBlur={field.onBlur}
        className="h-5 w-5 shrink-0 accent-brine-700"
      />
      {label}
    </label>
  );
}

/** Which alerts reach this person on which channel, and when to hold the non-critical ones back. */
export function NotificationPreferencesForm({ initial }: { initial: NotificationPreferences }) {
  const save = useSaveNotificationPreferences();
  const form = useZodForm(preferencesForm, { defaultValues: formValues(initial) });
  const [saved, setSaved] = useState(false);
  const id = useId();
  const [pushOn, emailOn, inAppOn, holdBack, zone] = useWatch({
    control: form.control,
    name: ['push', 'email', 'inApp', 'holdBack', 'timeZone'],
  });
  const zones = useMemo(() => timeZones(zone), [zone]);
  const zoneOptions = useMemo(() => zones.map((z) => ({ value: z, label: z.replace(/_/g, ' ') })), [zones]);
  const hereZone = deviceZone();

  // "Saved." stays only until the next change.
  useEffect(() => {
    const subscription = form.watch((_values, { name }) => {
      if (name) setSaved(false);
    });
    return () => subscription.unsubscribe();
  }, [form]);

  const criticalNowhere = [pushOn, emailOn, inAppOn].every((chosen) => !chosen.includes('critical'));

  return (
    <Form
      form={form}
      aria-labelledby={`${id}-title`}
      className="rounded-card bg-white p-4 shadow-card sm:p-6"
      onSubmit={async (preferences) => {
        const stored = await save.mutateAsync(preferences);
        form.reset(formValues(stored));
        setSaved(true);
      }}
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
                <ChannelChoice
                  key={channel.key}
                  channel={channel.key}
                  severity={severity}
                  label={channel.label}
                />
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

      <CheckboxGroupField
        name="visitReports"
        label="Visit reports"
        hint="When the company publishes the report of a visit to your tank."
        className="mt-6 rounded-lg border border-ink-100 p-3"
        columns="mt-2 flex flex-wrap gap-1.5 sm:grid sm:grid-cols-3 sm:gap-2"
        options={newsChannels}
      />

      <CheckboxGroupField
        name="messages"
        label="Messages"
        hint="A new message in a tank’s conversation. E-mail comes once, when a message has waited unread for 10 minutes."
        className="mt-6 rounded-lg border border-ink-100 p-3"
        columns="mt-2 flex flex-wrap gap-1.5 sm:grid sm:grid-cols-3 sm:gap-2"
        options={newsChannels}
      />

      <CheckboxGroupField
        name="urgentUpdates"
        label="Urgent visit requests"
        hint="Each change of an urgent visit you asked for: acknowledged, on the way, on site, resolved."
        className="mt-6 rounded-lg border border-ink-100 p-3"
        columns="mt-2 flex flex-wrap gap-1.5 sm:grid sm:grid-cols-3 sm:gap-2"
        options={newsChannels}
      />

      <CheckboxGroupField
        name="careTips"
        label="Care tips"
        hint="When the company sends advice about caring for your tank."
        className="mt-6 rounded-lg border border-ink-100 p-3"
        columns="mt-2 flex flex-wrap gap-1.5 sm:grid sm:grid-cols-3 sm:gap-2"
        options={newsChannels}
      />

      <fieldset className="mt-6">
        <legend className="text-lg font-bold text-ink-900">Quiet hours</legend>
        <CheckboxField name="holdBack" label="Hold back warnings and notices at night" className="mt-2" />
        {holdBack && (
          <div role="group" aria-describedby={`${id}-clock-hint`} className="mt-2 grid grid-cols-2 gap-3">
            <TextField
              name="quietHours.start"
              label="From"
              inputMode="numeric"
              autoComplete="off"
              placeholder="22:00"
            />
            <TextField
              name="quietHours.end"
              label="Until"
              inputMode="numeric"
              autoComplete="off"
              placeholder="07:00"
            />
            <p id={`${id}-clock-hint`} className="col-span-2 text-sm text-ink-700">
              On the 24-hour clock, such as 22:00 to 07:00.
            </p>
          </div>
        )}
      </fieldset>

      <div className="mt-6">
        <SelectField
          name="timeZone"
          label="Time zone"
          hint="Quiet hours and the times in your e-mails follow this zone."
          options={zoneOptions}
        />
        {hereZone && hereZone !== zone && zones.includes(hereZone) && (
          <button
            type="button"
            onClick={() => form.setValue('timeZone', hereZone, { shouldDirty: true })}
            className="mt-2 min-h-11 font-bold text-brine-700 underline"
          >
            Use this device’s zone ({hereZone.replace(/_/g, ' ')})
          </button>
        )}
      </div>

      <FormProblem />
      <div className="mt-6 flex flex-wrap items-center gap-3">
        <SubmitButton pending="Saving…">Save preferences</SubmitButton>
        <p role="status" className="font-bold text-healthy-700">
          {saved ? 'Saved.' : ''}
        </p>
      </div>
    </Form>
  );
}
