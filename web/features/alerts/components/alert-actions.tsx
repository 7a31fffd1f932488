import { useEffect, useId, useRef, useState, type FormEvent } from 'react';
import { resolveInput, type AlertView } from '@shared/schemas/alerts';
import { Button } from '../../../components/button';
import { FieldError } from '../../../components/form-fields';
import { ApiError } from '../../../lib/api-client';
import { groupIssues, problemMessage } from '../../../lib/form-issues';
import { useAcknowledgeAlert } from '../api/acknowledge-alert';
import { useResolveAlert } from '../api/resolve-alert';
import { NoteField } from './note-field';

type Mode = 'idle' | 'acknowledge' | 'resolve';

/**
 * Acknowledge (with an optional note) and resolve (with a required one), each as a small form
 * that opens in place. Nothing changes on screen until the API has answered.
 */
export function AlertActions({ alert, onDone }: { alert: AlertView; onDone: (message: string) => void }) {
  const [mode, setMode] = useState<Mode>('idle');
  const [note, setNote] = useState('');
  const [noteError, setNoteError] = useState<string>();
  const acknowledge = useAcknowledgeAlert();
  const resolve = useResolveAlert();
  const noteRef = useRef<HTMLTextAreaElement>(null);
  const container = useRef<HTMLDivElement>(null);
  const returnFocusTo = useRef<Mode>('idle');
  const formId = useId();

  useEffect(() => {
    if (mode !== 'idle') noteRef.current?.focus();
    else if (returnFocusTo.current !== 'idle') {
      container.current?.querySelector<HTMLElement>(`[data-action="${returnFocusTo.current}"]`)?.focus();
    }
    returnFocusTo.current = 'idle';
  }, [mode]);

  if (alert.status === 'resolved') return null;

  const start = (next: Mode) => {
    acknowledge.reset();
    resolve.reset();
    setNote('');
    setNoteError(undefined);
    setMode(next);
  };
  const cancel = () => {
    returnFocusTo.current = mode;
    setMode('idle');
  };

  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (mode === 'acknowledge') {
      acknowledge.mutate(
        { alertId: alert.id, note: note.trim() || undefined },
        {
          onSuccess: () => {
            setMode('idle');
            onDone(`Acknowledged: ${alert.title}.`);
          },
        },
      );
      return;
    }
    const checked = resolveInput.safeParse({ note });
    if (!checked.success) {
      setNoteError(checked.error.issues[0]?.message);
      noteRef.current?.focus();
      return;
    }
    setNoteError(undefined);
    resolve.mutate(
      { alertId: alert.id, note: checked.data.note },
      {
        onSuccess: () => {
          setMode('idle');
          onDone(`Resolved: ${alert.title}.`);
        },
        onError: (error) => {
          if (!(error instanceof ApiError)) return;
          const message = groupIssues(error.issues, ['note']).fields.note;
          if (message) {
            setNoteError(message);
            noteRef.current?.focus();
          }
        },
      },
    );
  };

  const pending = acknowledge.isPending || resolve.isPending;
  const failure = mode === 'acknowledge' ? acknowledge.error : resolve.error;
  const failureIsField =
    failure instanceof ApiError && groupIssues(failure.issues, ['note']).fields.note !== undefined;

  if (mode === 'idle') {
    return (
      <div ref={container} className="flex flex-wrap gap-2">
        {alert.status === 'open' && (
          <Button data-action="acknowledge" tone="primary" onClick={() => start('acknowledge')}>
            Acknowledge<span className="sr-only">: {alert.title}</span>
          </Button>
        )}
        <Button data-action="resolve" tone="secondary" onClick={() => start('resolve')}>
          Resolve<span className="sr-only">: {alert.title}</span>
        </Button>
      </div>
    );
  }

  const acknowledging = mode === 'acknowledge';
  return (
    <form
      noValidate
      onSubmit={submit}
      aria-labelledby={`${formId}-title`}
      className="rounded-lg border border-ink-100 bg-ink-50 p-4"
    >
      <p id={`${formId}-title`} className="font-bold text-ink-900">
        {acknowledging ? 'Acknowledge this alert' : 'Resolve this alert'}
      </p>
      <p className="mt-1 text-sm text-ink-700">
        {acknowledging
          ? 'The owner sees that someone is on it. The alert stays open until it is resolved.'
          : 'Resolve it once the tank is safe. If the reading is still out of range, a new alert opens.'}
      </p>
      <div className="mt-3">
        <NoteField
          ref={noteRef}
          label={acknowledging ? 'Note (optional)' : 'What was done'}
          hint={
            acknowledging
              ? 'For example: on my way, there within the hour.'
              : 'For example: heater replaced, temperature back to 25.5 °C.'
          }
          value={note}
          onChange={setNote}
          required={!acknowledging}
          error={noteError}
        />
      </div>
      {failure && !failureIsField && (
        <div role="alert">
          <FieldError>{problemMessage(failure)}</FieldError>
        </div>
      )}
      <div className="mt-4 flex flex-wrap gap-2">
        <Button type="submit" disabled={pending}>
          {acknowledging
            ? acknowledge.isPending
              ? 'Acknowledging…'
              : 'Acknowledge alert'
            : resolve.isPending
              ? 'Resolving…'
              : 'Resolve alert'}
        </Button>
        <Button tone="secondary" onClick={cancel} disabled={pending}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
