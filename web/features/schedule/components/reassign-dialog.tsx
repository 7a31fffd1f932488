import { z } from 'zod';
import { updateVisitInput, type VisitSummary } from '@shared/schemas/visits';
import { Button } from '../../../components/button';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { SelectField } from '../../../components/form-fields';
import { SheetDialog } from '../../../components/sheet-dialog';
import { formatVisitWindow } from '../../../lib/format';
import { blankAsNull } from '../../../lib/form-values';
import { useTechnicians } from '../../../lib/queries/technicians';
import { useUpdateVisit } from '../api/update-visit';

const reassignForm = z.object({ technicianId: blankAsNull(updateVisitInput.shape.technicianId) });

/** Gives a visit to another member of staff (admins), in the sheet small forms open in. */
export function ReassignDialog({ visit, onClose }: { visit: VisitSummary; onClose: () => void }) {
  const staff = useTechnicians();
  const update = useUpdateVisit(visit.id);
  const form = useZodForm(reassignForm, { defaultValues: { technicianId: visit.technician?.id ?? '' } });

  const options = [
    { value: '', label: 'Nobody yet' },
    ...(staff.data ?? []).map((person) => ({ value: person.id, label: person.name })),
  ];
  // A person who has since left the staff list still shows as the current choice.
  if (visit.technician && !options.some((option) => option.value === visit.technician?.id)) {
    options.push({ value: visit.technician.id, label: visit.technician.name });
  }

  return (
    <SheetDialog title="Reassign the visit" onClose={onClose}>
      <p className="text-ink-700">
        {visit.tankName}, {formatVisitWindow(visit.windowStart, visit.windowEnd, visit.timeZone)}
      </p>
      <Form
        form={form}
        aria-label="Reassign the visit"
        className="mt-4 grid gap-4"
        onSubmit={async (values) => {
          await update.mutateAsync({ technicianId: values.technicianId });
          onClose();
        }}
      >
        <SelectField
          name="technicianId"
          label="Technician"
          hint={staff.isError ? 'The staff list could not be loaded; try again in a moment.' : undefined}
          options={options}
          disabled={staff.isPending}
        />
        <FormProblem />
        <div className="flex flex-col-reverse gap-2 sm:flex-row sm:justify-end">
          <Button tone="secondary" onClick={onClose}>
            Keep as it is
          </Button>
          <SubmitButton pending="Saving…">Reassign</SubmitButton>
        </div>
      </Form>
    </SheetDialog>
  );
}
