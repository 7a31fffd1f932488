import { useEffect } from 'react';
import { useWatch } from 'react-hook-form';
import { z } from 'zod';
import { scheduleVisitInput, visitKindLabels, visitKinds, type VisitSummary } from '@shared/schemas/visits';
import { Button } from '../../../components/button';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { CheckboxField, SelectField, TextAreaField, TextField } from '../../../components/form-fields';
import { useTankChoices } from '../../../lib/queries/tank-choices';
import { useTechnicians } from '../../../lib/queries/technicians';
import { useScheduleVisit } from '../api/schedule-visit';

/** The shared request, with words for the tank select's empty start. */
const planVisitForm = scheduleVisitInput.safeExtend({
  tankId: z.string().min(1, 'choose a tank').pipe(scheduleVisitInput.shape.tankId),
});

/**
 * Plans a visit to one tank: what kind, when (wall times at the tank), and — for admins — who.
 * A routine service can repeat at the tank's service interval; the API writes the series out.
 */
export function PlanVisitForm({
  day,
  me,
  canAssign,
  onPlanned,
  onCancel,
}: {
  /** The day the schedule shows, where a new visit most likely goes. */
  day: string;
  me: { id: string };
  canAssign: boolean;
  onPlanned: (visit: VisitSummary) => void;
  onCancel: () => void;
}) {
  const tanks = useTankChoices();
  const staff = useTechnicians();
  const schedule = useScheduleVisit();
  const form = useZodForm(planVisitForm, {
    defaultValues: {
      tankId: '',
      kind: 'routine',
      // Left out for a technician, so the API gives the visit to whoever plans it.
      technicianId: canAssign ? me.id : undefined,
      date: day,
      startTime: '09:00',
      endTime: '10:00',
      repeats: false,
      note: '',
    },
  });
  const [kind, tankId, repeats] = useWatch({ control: form.control, name: ['kind', 'tankId', 'repeats'] });
  const tank = tanks.data?.find((candidate) => candidate.id === tankId);
  const { setValue } = form;

  // Only routine service repeats; another kind takes the tick away rather than refuse the form.
  useEffect(() => {
    if (kind !== 'routine' && repeats) setValue('repeats', false);
  }, [kind, repeats, setValue]);

  return (
    <Form
      form={form}
      aria-label="Plan a visit"
      className="grid gap-4 sm:grid-cols-2"
      onSubmit={async (values) => onPlanned(await schedule.mutateAsync(values))}
    >
      <SelectField
        name="tankId"
        label="Tank"
        className="sm:col-span-2"
        disabled={tanks.isPending}
        hint={tanks.isError ? 'The tanks could not be loaded; try again in a moment.' : undefined}
        options={[
          { value: '', label: tanks.isPending ? 'Loading tanks…' : 'Choose a tank' },
          ...(tanks.data ?? []).map((candidate) => ({
            value: candidate.id,
            label: candidate.siteLabel ? `${candidate.name} — ${candidate.siteLabel}` : candidate.name,
          })),
        ]}
      />
      <SelectField
        name="kind"
        label="Kind of visit"
        options={visitKinds.map((value) => ({ value, label: visitKindLabels[value] }))}
      />
      {canAssign && (
        <SelectField
          name="technicianId"
          label="Technician"
          disabled={staff.isPending}
          options={(staff.data ?? [{ id: me.id, name: 'Me' }]).map((person) => ({
            value: person.id,
            label: person.id === me.id ? `${person.name} (me)` : person.name,
          }))}
        />
      )}
      <TextField name="date" label="Day" type="date" className="sm:col-start-1" />
      <div className="grid grid-cols-2 gap-3">
        <TextField name="startTime" label="From" type="time" hint="At the tank" />
        <TextField name="endTime" label="To" type="time" hint="At the tank" />
      </div>
      {kind === 'routine' && (
        <CheckboxField
          name="repeats"
          label="Repeat at the tank's service interval"
          className="sm:col-span-2"
          hint={
            tank
              ? `Every ${tank.serviceIntervalDays} days from this day, planned about three months ahead.`
              : 'Choose a tank to see its service interval.'
          }
        />
      )}
      <TextAreaField
        name="note"
        label="Note for the visit"
        hint="Optional: access, parking, what to bring"
        className="sm:col-span-2"
        maxLength={1000}
      />
      <FormProblem className="sm:col-span-2" />
      <div className="flex flex-col-reverse gap-2 sm:col-span-2 sm:flex-row sm:justify-end">
        <Button tone="secondary" onClick={onCancel}>
          Close
        </Button>
        <SubmitButton pending="Planning…">Plan the visit</SubmitButton>
      </div>
    </Form>
  );
}
