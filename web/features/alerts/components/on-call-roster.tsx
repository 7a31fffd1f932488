import { useId, useState, type FormEvent } from 'react';
import { onCallShiftInput, type OnCallShiftView } from '@shared/schemas/on-call';
import { Button } from '../../../components/button';
import { FieldError } from '../../../components/form-fields';
import { ErrorState, LoadingState } from '../../../components/states';
import { ApiError } from '../../../lib/api-client';
import { groupIssues, problemMessage } from '../../../lib/form-issues';
import { useStaff } from '../../staff/api/list-staff';
import { useAddOnCallShift } from '../api/add-on-call-shift';
import { useOnCallShifts } from '../api/list-on-call-shifts';
import { useRemoveOnCallShift } from '../api/remove-on-call-shift';
import { formatDateTime } from '../utils/time';

const fieldClass = (invalid: boolean) =>
  `mt-1 min-h-12 w-full min-w-0 rounded-lg border-2 bg-white px-3 text-base text-ink-950 ${
    invalid ? 'border-alert-700' : 'border-ink-300 focus:border-ink-700'
  }`;

/** `YYYY-MM-DDTHH:mm` in the browser's own zone, as a datetime-local field holds it. */
function localInputValue(date: Date): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${date.getFullYear()}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}T${pad(date.getHours())}:${pad(date.getMinutes())}`;
}

function defaultShift() {
  const start = new Date();
  start.setHours(start.getHours() + 1, 0, 0, 0);
  const end = new Date(start.getTime() + 12 * 3_600_000);
  return { startsAt: localInputValue(start), endsAt: localInputValue(end) };
}

const toInstant = (local: string) => {
  const date = new Date(local);
  return Number.isNaN(date.getTime()) ? local : date.toISOString();
};

function ShiftRow({ shift, canManage }: { shift: OnCallShiftView; canManage: boolean }) {
  const remove = useRemoveOnCallShift();
  return (
    <li className="flex flex-col gap-2 p-4 sm:flex-row sm:items-center sm:justify-between">
      <div className="min-w-0">
        <p className="flex flex-wrap items-center gap-2 font-bold text-ink-900">
          {shift.user.name}
          {shift.current && (
            <span className="inline-flex items-center gap-1.5 rounded-full bg-healthy-100 px-2.5 py-0.5 text-sm text-healthy-700">
              <span aria-hidden="true" className="h-2 w-2 rounded-full bg-current" />
              On call now
            </span>
          )}
        </p>
        <p className="text-sm text-ink-700">
          {formatDateTime(shift.startsAt)} to {formatDateTime(shift.endsAt)}
        </p>
        {remove.isError && <FieldError>{problemMessage(remove.error)}</FieldError>}
      </div>
      {canManage && (
        <Button
          tone="secondary"
          onClick={() => remove.mutate(shift.id)}
          disabled={remove.isPending}
          className="self-start sm:self-center"
        >
          {remove.isPending ? 'Removing…' : 'Remove'}
          <span className="sr-only">
            {' '}
            {shift.user.name}’s shift from {formatDateTime(shift.startsAt)}
          </span>
        </Button>
      )}
    </li>
  );
}

type ShiftField = 'userId' | 'startsAt' | 'endsAt';

function AddShiftForm() {
  const staff = useStaff();
  const add = useAddOnCallShift();
  const [form, setForm] = useState(() => ({ userId: '', ...defaultShift() }));
  const [errors, setErrors] = useState<Partial<Record<ShiftField, string>>>({});
  const [other, setOther] = useState<string>();
  const [saved, setSaved] = useState<string>();
  const id = useId();
  const people = staff.data?.filter((person) => person.role !== 'owner' && person.status === 'active') ?? [];

  const submit = (event: FormEvent) => {
    event.preventDefault();
    setSaved(undefined);
    setOther(undefined);
    const input = { userId: form.userId, startsAt: toInstant(form.startsAt), endsAt: toInstant(form.endsAt) };
    const checked = onCallShiftInput.safeParse(input);
    if (!checked.success) {
      const grouped = groupIssues(
        checked.error.issues.map((issue) => ({
          path: issue.path.join('.'),
          message: issue.path[0] === 'userId' ? 'Choose who is on call.' : issue.message,
        })),
        ['userId', 'startsAt', 'endsAt'],
      );
      setErrors(grouped.fields);
      return;
    }
    setErrors({});
    add.mutate(checked.data, {
      onSuccess: () => {
        const name = people.find((person) => person.id === checked.data.userId)?.name ?? 'The shift';
        setSaved(`${name} is on the roster.`);
        setForm({ userId: '', ...defaultShift() });
      },
      onError: (error) => {
        if (error instanceof ApiError && error.issues.length > 0) {
          const grouped = groupIssues(error.issues, ['userId', 'startsAt', 'endsAt']);
          setErrors(grouped.fields);
          setOther(grouped.other[0]);
        } else setOther(problemMessage(error));
      },
    });
  };

  return (
    <form
      noValidate
      onSubmit={submit}
      aria-labelledby={`${id}-title`}
      className="border-t border-ink-100 p-4"
    >
      <h3 id={`${id}-title`} className="font-bold text-ink-900">
        Add a shift
      </h3>
      <div className="mt-3 grid gap-3">
        <div>
          <label htmlFor={`${id}-person`} className="block text-sm font-bold text-ink-900">
            Who
          </label>
          <select
            id={`${id}-person`}
            value={form.userId}
            onChange={(event) => setForm({ ...form, userId: event.target.value })}
            aria-invalid={errors.userId ? true : undefined}
            aria-describedby={errors.userId ? `${id}-person-error` : undefined}
            className={fieldClass(Boolean(errors.userId))}
          >
            <option value="">{staff.isPending ? 'Loading staff…' : 'Choose a person'}</option>
            {people.map((person) => (
              <option key={person.id} value={person.id}>
                {person.name}
              </option>
            ))}
          </select>
          {errors.userId && <FieldError id={`${id}-person-error`}>{errors.userId}</FieldError>}
          {staff.isError && <FieldError>{problemMessage(staff.error)}</FieldError>}
        </div>
        <div className="grid gap-3 sm:grid-cols-2">
          {(['startsAt', 'endsAt'] as const).map((field) => (
            <div key={field} className="min-w-0">
              <label htmlFor={`${id}-${field}`} className="block text-sm font-bold text-ink-900">
                {field === 'startsAt' ? 'Starts' : 'Ends'}
              </label>
              <input
                id={`${id}-${field}`}
                type="datetime-local"
                value={form[field]}
                onChange={(event) => setForm({ ...form, [field]: event.target.value })}
                aria-invalid={errors[field] ? true : undefined}
                aria-describedby={errors[field] ? `${id}-${field}-error` : undefined}
                className={fieldClass(Boolean(errors[field]))}
              />
              {errors[field] && <FieldError id={`${id}-${field}-error`}>{errors[field]}</FieldError>}
            </div>
          ))}
        </div>
      </div>
      {other && (
        <div role="alert">
          <FieldError>{other}</FieldError>
        </div>
      )}
      <p role="status" className="mt-2 text-sm font-bold text-healthy-700">
        {saved}
      </p>
      <Button type="submit" disabled={add.isPending} className="mt-2 w-full sm:w-auto">
        {add.isPending ? 'Adding…' : 'Add shift'}
      </Button>
    </form>
  );
}

/** Who answers out of hours: critical alerts also reach whoever is on call. Admins change it. */
export function OnCallRoster({ canManage }: { canManage: boolean }) {
  const shifts = useOnCallShifts();
  return (
    <section aria-labelledby="on-call-title" className="rounded-card bg-white shadow-card">
      <div className="p-4 pb-0">
        <h2 id="on-call-title" className="text-xl font-bold text-ink-900">
          On-call roster
        </h2>
        <p className="mt-1 text-sm text-ink-700">
          Critical alerts also go to whoever is on call at the time.
        </p>
      </div>
      <div className="mt-2">
        {shifts.isPending ? (
          <div className="p-4">
            <LoadingState label="Loading the roster…" />
          </div>
        ) : shifts.isError ? (
          <div className="p-4">
            <ErrorState
              error={shifts.error}
              what="the on-call roster"
              onRetry={() => void shifts.refetch()}
            />
          </div>
        ) : shifts.data.length === 0 ? (
          <p className="p-4 text-ink-700">
            Nobody is on call. Critical alerts reach the tank’s owners and its technician only.
          </p>
        ) : (
          <ul className="divide-y divide-ink-100">
            {shifts.data.map((shift) => (
              <ShiftRow key={shift.id} shift={shift} canManage={canManage} />
            ))}
          </ul>
        )}
      </div>
      {canManage && <AddShiftForm />}
    </section>
  );
}
