import { useId } from 'react';
import { FieldError } from '../../../components/form-fields';
import { useTanks } from '../api/list-tanks';

/** The tank a client is invited to follow; its own loading, empty and error states. */
export function TankField({
  value,
  onChange,
  error,
}: {
  value: string;
  onChange: (tankId: string) => void;
  error?: string;
}) {
  const id = useId();
  const tanks = useTanks();
  const noteId = `${id}-note`;
  const errorId = `${id}-error`;
  const note = tanks.isPending
    ? 'Loading tanks…'
    : tanks.isError
      ? 'The tanks could not be loaded. Reload the page to try again.'
      : tanks.data.length === 0
        ? 'Your company has no tanks yet. Add a tank before inviting its owner.'
        : 'They will see this tank and its readings, visits and alerts.';
  const describedBy = [noteId, error && errorId].filter(Boolean).join(' ');
  return (
    <div>
      <label htmlFor={id} className="block font-bold text-ink-900">
        Tank
      </label>
      <p id={noteId} className="mt-1 text-sm text-ink-700">
        {note}
      </p>
      <select
        id={id}
        value={value}
        onChange={(event) => onChange(event.target.value)}
        disabled={!tanks.isSuccess || tanks.data.length === 0}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
        className={`mt-2 min-h-12 w-full rounded-lg border-2 bg-white px-3 text-base text-ink-950 disabled:bg-ink-50 ${
          error ? 'border-alert-700' : 'border-ink-300 focus:border-ink-700'
        }`}
      >
        <option value="">Choose a tank</option>
        {tanks.data?.map((tank) => (
          <option key={tank.id} value={tank.id}>
            {tank.siteLabel ? `${tank.name} — ${tank.siteLabel}` : tank.name}
          </option>
        ))}
      </select>
      {error && <FieldError id={errorId}>{error}</FieldError>}
    </div>
  );
}
