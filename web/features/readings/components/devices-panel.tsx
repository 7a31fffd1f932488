import { useId, useState } from 'react';
import { createDeviceInput, type CreatedDevice } from '@shared/schemas/readings';
import { Button } from '../../../components/button';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { TextField } from '../../../components/form-fields';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { useCreateDevice } from '../api/create-device';
import { useDevices } from '../api/list-devices';
import { useRevokeDevice } from '../api/revoke-device';
import { formatDateTime, relativeTime } from '../../../lib/format';

/** Staff connect a tank's controller or probe: a token per device, shown once, revocable. */
export function DevicesPanel({ tankId }: { tankId: string }) {
  const id = useId();
  const devices = useDevices(tankId);
  const create = useCreateDevice(tankId);
  const revoke = useRevokeDevice(tankId);
  const [created, setCreated] = useState<CreatedDevice | null>(null);
  const [copied, setCopied] = useState(false);
  const [confirming, setConfirming] = useState<string | null>(null);
  const form = useZodForm(createDeviceInput, { defaultValues: { name: '' } });

  const copy = async () => {
    if (!created) return;
    try {
      await navigator.clipboard.writeText(created.token);
      setCopied(true);
    } catch {
      setCopied(false);
    }
  };

  return (
    <section aria-labelledby={`${id}-title`} className="rounded-card bg-white p-4 shadow-card sm:p-6">
      <h3 id={`${id}-title`} className="text-xl font-bold text-ink-900">
        Devices
      </h3>
      <p className="mt-1 text-sm text-ink-700">
        A controller or probe posts its readings with its own token. The token is shown once, when the device
        is added; Brinewatch keeps only a fingerprint of it.
      </p>

      <div className="mt-4">
        {devices.isPending ? (
          <LoadingState label="Loading devices…" />
        ) : devices.isError ? (
          <ErrorState error={devices.error} what="the devices" onRetry={() => void devices.refetch()} />
        ) : devices.data.length === 0 ? (
          <EmptyState title="No devices on this tank">
            Add one below to start receiving its readings.
          </EmptyState>
        ) : (
          <ul className="divide-y divide-ink-100 rounded-lg border border-ink-100">
            {devices.data.map((device) => (
              <li key={device.id} className="flex flex-wrap items-center justify-between gap-3 p-3">
                <div className="min-w-0">
                  <p className="font-bold text-ink-900">
                    {device.name}{' '}
                    <span
                      className={`ml-1 text-sm ${device.revokedAt ? 'text-alert-700' : 'text-healthy-700'}`}
                    >
                      {device.revokedAt ? '✕ Revoked' : '✓ Active'}
                    </span>
                  </p>
                  <p className="text-sm text-ink-700">
                    Token <code>{device.tokenHint}…</code> ·{' '}
                    {device.lastSeenAt ? (
                      <>
                        last seen{' '}
                        <time dateTime={device.lastSeenAt} title={formatDateTime(device.lastSeenAt)}>
                          {relativeTime(device.lastSeenAt)}
                        </time>
                      </>
                    ) : (
                      'not heard from yet'
                    )}
                  </p>
                </div>
                {!device.revokedAt &&
                  (confirming === device.id ? (
                    <div className="flex gap-2">
                      <Button
                        tone="danger"
                        onClick={() => revoke.mutate(device.id, { onSettled: () => setConfirming(null) })}
                        disabled={revoke.isPending}
                      >
                        Revoke now<span className="sr-only"> {device.name}</span>
                      </Button>
                      <Button tone="secondary" onClick={() => setConfirming(null)}>
                        Keep
                      </Button>
                    </div>
                  ) : (
                    <Button tone="secondary" onClick={() => setConfirming(device.id)}>
                      Revoke<span className="sr-only"> {device.name}</span>
                    </Button>
                  ))}
              </li>
            ))}
          </ul>
        )}
      </div>

      {created && (
        <div role="status" className="mt-4 rounded-lg border-2 border-healthy-700 bg-healthy-100 p-4">
          <p className="font-bold text-healthy-700">
            ✓ {created.device.name} added. Copy its token now: it is not shown again.
          </p>
          <label htmlFor={`${id}-token`} className="mt-2 block text-sm font-bold text-ink-900">
            Device token
          </label>
          <div className="mt-1 flex gap-2">
            <input
              id={`${id}-token`}
              readOnly
              value={created.token}
              onFocus={(event) => event.target.select()}
              className="min-h-11 w-full min-w-0 rounded-lg border-2 border-ink-300 bg-white px-3 font-mono text-sm"
            />
            <Button onClick={() => void copy()} className="shrink-0">
              {copied ? '✓ Copied' : 'Copy'}
            </Button>
          </div>
          <p className="mt-2 text-sm text-ink-800">
            The device sends <code>POST /api/ingest/readings</code> with <code>Authorization: Bearer</code>{' '}
            and this token (see the README).
          </p>
          <Button tone="secondary" className="mt-2" onClick={() => setCreated(null)}>
            Done
          </Button>
        </div>
      )}

      <Form
        form={form}
        className="mt-4 flex flex-wrap items-end gap-2"
        onSubmit={async (input) => {
          const result = await create.mutateAsync(input);
          setCreated(result);
          setCopied(false);
          form.reset();
        }}
      >
        <TextField
          name="name"
          label="New device name"
          maxLength={80}
          placeholder="e.g. Sump controller"
          className="min-w-48 flex-1"
        />
        <SubmitButton pending="Adding…">Add device</SubmitButton>
        <FormProblem className="w-full" />
      </Form>
    </section>
  );
}
