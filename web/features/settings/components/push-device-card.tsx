import { Button } from '../../../components/button';
import { FieldError } from '../../../components/field-error';
import { LoadingState } from '../../../components/states';
import { problemMessage } from '../../../lib/problem-message';
import { PushSetupError } from '../utils/web-push';
import { usePushDevice } from './use-push-device';

const setupProblems = {
  blocked:
    'Notifications are blocked for Brinewatch in this browser. Allow them in the browser’s settings for this site, then try again.',
  dismissed: 'The browser did not get permission. Try again, and choose Allow when the browser asks.',
  'no-key': 'This Brinewatch server cannot send notifications to devices yet.',
  'browser-refused': 'This browser could not set up notifications here.',
} as const;

function setupMessage(error: unknown): string {
  if (error instanceof PushSetupError) return setupProblems[error.problem];
  return problemMessage(error);
}

const stillReaches = 'Alerts still reach you in Brinewatch and, if you chose it, by e-mail.';

/** Push notifications on this phone or computer: on, off, or why not. */
export function PushDeviceCard() {
  const { device, turnOn, turnOff } = usePushDevice();
  const failure = turnOn.error ?? turnOff.error;
  const pending = turnOn.isPending || turnOff.isPending;

  let body: React.ReactNode;
  if (device.isPending) body = <LoadingState label="Checking this device…" />;
  else if (device.isError) {
    body = <p className="text-ink-900">This browser could not set up notifications here. {stillReaches}</p>;
  } else if (device.data.availability !== 'available') {
    body = (
      <p className="text-ink-900">
        {device.data.availability === 'insecure'
          ? 'Notifications need a secure (https) connection to Brinewatch.'
          : 'This browser cannot show notifications from websites.'}{' '}
        {stillReaches}
      </p>
    );
  } else if (device.data.endpoint) {
    body = (
      <>
        <p className="flex items-center gap-2 font-bold text-healthy-700">
          <svg viewBox="0 0 12 12" className="h-4 w-4 shrink-0" aria-hidden="true" focusable="false">
            <path d="M1.5 6.5 4.5 9.5 10.5 2.5" fill="none" stroke="currentColor" strokeWidth="2" />
          </svg>
          On: this device gets notifications.
        </p>
        <p className="mt-1 text-sm text-ink-700">
          Which alerts arrive here follows the Push column above. Critical alerts stay on screen until you
          dismiss them.
        </p>
        <Button tone="secondary" className="mt-3" onClick={() => turnOff.mutate()} disabled={pending}>
          {turnOff.isPending ? 'Turning off…' : 'Turn off on this device'}
        </Button>
      </>
    );
  } else {
    body = (
      <>
        <p className="flex items-center gap-2 font-bold text-ink-900">
          <svg viewBox="0 0 12 12" className="h-4 w-4 shrink-0" aria-hidden="true" focusable="false">
            <circle cx="6" cy="6" r="4.6" fill="none" stroke="currentColor" strokeWidth="1.6" />
          </svg>
          Off: this device gets no notifications.
        </p>
        {device.data.permission === 'denied' && (
          <p className="mt-1 text-sm text-ink-700">{setupProblems.blocked}</p>
        )}
        <Button className="mt-3" onClick={() => turnOn.mutate()} disabled={pending}>
          {turnOn.isPending ? 'Turning on…' : 'Turn on for this device'}
        </Button>
      </>
    );
  }

  return (
    <section aria-labelledby="push-device-title" className="rounded-card bg-white p-4 shadow-card sm:p-6">
      <h2 id="push-device-title" className="text-xl font-bold text-ink-900">
        This device
      </h2>
      <p className="mt-1 text-sm text-ink-700">
        Get alerts on this phone or computer even when Brinewatch is closed. Turn it on on each device you
        use.
      </p>
      <div className="mt-4">{body}</div>
      <div role="alert">
        {failure && (
          <FieldError>
            {setupMessage(failure)}{' '}
            {failure instanceof PushSetupError && failure.problem !== 'dismissed' && stillReaches}
          </FieldError>
        )}
      </div>
    </section>
  );
}
