import { useId, useState } from 'react';
import { z } from 'zod';
import { isStaffRole } from '@shared/people/permissions';
import { onCallShiftInput, type OnCallShiftView } from '@shared/schemas/on-call';
import { Badge } from '../../../components/badge';
import { Button } from '../../../components/button';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { FieldError } from '../../../components/field-error';
import { SelectField, TextField } from '../../../components/form-fields';
import { ErrorState, LoadingState } from '../../../components/states';
import { problemMessage } from '../../../lib/problem-message';
import { formatDateTime, instantFromLocalInput, localInputValue } from '../../../lib/format';
import { useStaff } from '../../../lib/queries/people';
import { useAddOnCallShift } from '../api/add-on-call-shift';
import { useOnCallShifts } from '../api/list-on-call-shifts';
import { useRemoveOnCallShift } from '../api/remove-on-call-shift';

function defaultShift() {
  const start = new Date();
  start.setHours(start.getHours() + 1, 0, 0, 0);
  const end = new Date(start.getTime() + 12 * 3_600_000);
  return { userId: '', startsAt: localInputValue(start), endsAt: localInputValue(end) };
}

/** A datetime-local field's text as the instant the shared schema wants. */
const localInstant = z.string().transform((value, context) => {
  const instant = instantFromLocalInput(value);
  if (instant === null) {
    context.addIssue({ code: 'custom', message: 'Enter a date and time.' });
    return z.NEVER;
  }
  return instant;
});

// The shared schema then checks the shift itself (it ends after it starts).
const addShiftForm = z
  .object({ userId: z.uuid('Choose who is on call.'), startsAt: localInstant, endsAt: localInstant })
  .pipe(onCallShiftInput);

function ShiftRow({ shift, canManage }: { shift: OnCallShiftView; canManage: boolean }) {
  const remove = useRemoveOnCallShift();
  return (
    <li className="flex flex-col gap-2 p-4 sm:flex-row sm:items-center sm:justify-between">
      <div className="min-w-0">
        <p className="flex flex-wrap items-center gap-2 font-bold text-ink-900">
          {shift.user.name}
          {shift.current && (
            <Badge
              tone="bg-healthy-100 text-healthy-700"
              mark={<span className="h-2 w-2 rounded-full bg-current" />}
            >
              On call now
            </Badge>
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

function AddShiftForm() {
  const staff = useStaff();
  const add = useAddOnCallShift();
  const form = useZodForm(addShiftForm, { defaultValues: defaultShift() });
  const [saved, setSaved] = useState<string>();
  const id = useId();
  const people = staff.data?.filter((person) => isStaffRole(person.role) && person.status === 'active') ?? [];
  const options = [
    { value: '', label: staff.isPending ? 'Loading staff…' : 'Choose a person' },
    ...people.map((person) => ({ value: person.id, label: person.name })),
  ];

  return (
    <Form
      form={form}
      aria-labelledby={`${id}-title`}
      className="@container border-t border-ink-100 p-4"
      onSubmit={async (shift) => {
        setSaved(undefined);
        await add.mutateAsync(shift);
        const name = people.find((person) => person.id === shift.userId)?.name ?? 'The shift';
        setSaved(`${name} is on the roster.`);
        form.reset(defaultShift());
      }}
    >
      <h3 id={`${id}-title`} className="font-bold text-ink-900">
        Add a shift
      </h3>
      <div className="mt-3 grid gap-3">
        <div>
          <SelectField name="userId" label="Who" options={options} />
          {staff.isError && <FieldError>{problemMessage(staff.error)}</FieldError>}
        </div>
        {/* Side by side only where the form itself is wide enough for two whole date-and-time inputs:
            beside the alerts board at 1280 px it is a narrow column, whatever the screen. */}
        <div className="grid gap-3 @lg:grid-cols-2">
          <TextField name="startsAt" label="Starts" type="datetime-local" />
          <TextField name="endsAt" label="Ends" type="datetime-local" />
        </div>
      </div>
      <FormProblem />
      <p role="status" className="mt-2 text-sm font-bold text-healthy-700">
        {saved}
      </p>
      <SubmitButton pending="Adding…" className="mt-2 w-full sm:w-auto">
        Add shift
      </SubmitButton>
    </Form>
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
