import { useEffect, useId, useRef, useState } from 'react';
import { acknowledgeInput, resolveInput, type AlertView } from '@shared/schemas/alerts';
import { Button } from '../../../components/button';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { TextAreaField } from '../../../components/form-fields';
import { useAcknowledgeAlert } from '../api/acknowledge-alert';
import { useResolveAlert } from '../api/resolve-alert';

type Mode = 'idle' | 'acknowledge' | 'resolve';

const modes = {
  acknowledge: {
    schema: acknowledgeInput,
    title: 'Acknowledge this alert',
    explanation: 'The owner sees that someone is on it. The alert stays open until it is resolved.',
    label: 'Note (optional)',
    hint: 'For example: on my way, there within the hour.',
    submit: 'Acknowledge alert',
    pending: 'Acknowledging…',
    done: 'Acknowledged',
  },
  resolve: {
    schema: resolveInput,
    title: 'Resolve this alert',
    explanation: 'Resolve it once the tank is safe. If the reading is still out of range, a new alert opens.',
    label: 'What was done',
    hint: 'For example: heater replaced, temperature back to 25.5 °C.',
    submit: 'Resolve alert',
    pending: 'Resolving…',
    done: 'Resolved',
  },
} as const;

/** The note form for one action; the API's answer (a note it refused, an alert already closed) shows in it. */
function NoteForm({
  alert,
  mode,
  onSent,
  onCancel,
}: {
  alert: AlertView;
  mode: Exclude<Mode, 'idle'>;
  onSent: () => void;
  onCancel: () => void;
}) {
  const words = modes[mode];
  const acknowledge = useAcknowledgeAlert();
  const resolve = useResolveAlert();
  // Both schemas have the one `note` field; the resolve schema only adds that it is required.
  const form = useZodForm(words.schema as typeof acknowledgeInput, { defaultValues: { note: '' } });
  const formId = useId();

  useEffect(() => form.setFocus('note'), [form]);

  return (
    <Form
      form={form}
      aria-labelledby={`${formId}-title`}
      className="rounded-lg border border-ink-100 bg-ink-50 p-4"
      onSubmit={async ({ note }) => {
        if (mode === 'acknowledge')
          await acknowledge.mutateAsync({ alertId: alert.id, note: note || undefined });
        else await resolve.mutateAsync({ alertId: alert.id, note: note ?? '' });
        onSent();
      }}
    >
      <p id={`${formId}-title`} className="font-bold text-ink-900">
        {words.title}
      </p>
      <p className="mt-1 text-sm text-ink-700">{words.explanation}</p>
      <TextAreaField
        name="note"
        label={words.label}
        hint={words.hint}
        maxLength={1000}
        required={mode === 'resolve'}
        className="mt-3"
      />
      <FormProblem />
      <div className="mt-4 flex flex-wrap gap-2">
        <SubmitButton pending={words.pending}>{words.submit}</SubmitButton>
        <Button tone="secondary" onClick={onCancel} disabled={form.formState.isSubmitting}>
          Cancel
        </Button>
      </div>
    </Form>
  );
}

/**
 * Acknowledge (with an optional note) and resolve (with a required one), each as a small form
 * that opens in place. Nothing changes on screen until the API has answered.
 */
export function AlertActions({ alert, onDone }: { alert: AlertView; onDone: (message: string) => void }) {
  const [mode, setMode] = useState<Mode>('idle');
  const container = useRef<HTMLDivElement>(null);
  const returnFocusTo = useRef<Mode>('idle');

  useEffect(() => {
    if (mode === 'idle' && returnFocusTo.current !== 'idle') {
      container.current?.querySelector<HTMLElement>(`[data-action="${returnFocusTo.current}"]`)?.focus();
    }
    returnFocusTo.current = 'idle';
  }, [mode]);

  if (alert.status === 'resolved') return null;

  if (mode === 'idle') {
    return (
      <div ref={container} className="flex flex-wrap gap-2">
        {alert.status === 'open' && (
          <Button data-action="acknowledge" tone="primary" onClick={() => setMode('acknowledge')}>
            Acknowledge<span className="sr-only">: {alert.title}</span>
          </Button>
        )}
        <Button data-action="resolve" tone="secondary" onClick={() => setMode('resolve')}>
          Resolve<span className="sr-only">: {alert.title}</span>
        </Button>
      </div>
    );
  }

  return (
    <NoteForm
      key={mode}
      alert={alert}
      mode={mode}
      onSent={() => {
        setMode('idle');
        onDone(`${modes[mode].done}: ${alert.title}.`);
      }}
      onCancel={() => {
        returnFocusTo.current = mode;
        setMode('idle');
      }}
    />
  );
}
