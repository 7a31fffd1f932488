import { useState } from 'react';
import { z } from 'zod';
import {
  equipmentInput,
  equipmentIssues,
  equipmentKindLabels,
  equipmentKinds,
  type EquipmentInput,
  type EquipmentItem,
} from '@shared/schemas/equipment';
import { Button } from '../../../components/button';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { SelectField, TextAreaField, TextField } from '../../../components/form-fields';
import { blankAsNull, decimalDefault, decimalText } from '../../../lib/form-values';
import { problemMessage } from '../../../lib/problem-message';
import { useCreateEquipment } from '../api/create-equipment';
import { useDeleteEquipment } from '../api/delete-equipment';
import { useUpdateEquipment } from '../api/update-equipment';

const fields = equipmentInput.shape;

/** Blank text is sent as null, so clearing a field on a change clears it on the record too. */
const equipmentForm = z
  .object({
    kind: fields.kind,
    description: fields.description,
    powerBoard: blankAsNull(fields.powerBoard),
    outlet: blankAsNull(fields.outlet),
    installedOn: blankAsNull(fields.installedOn),
    lastServicedOn: blankAsNull(fields.lastServicedOn),
    maintenanceIntervalDays: decimalText(fields.maintenanceIntervalDays).transform((days) => days ?? null),
    notes: blankAsNull(fields.notes),
  })
  .superRefine((input, context) => {
    for (const issue of equipmentIssues(input)) {
      context.addIssue({ code: 'custom', path: [issue.path], message: issue.message });
    }
  });
type EquipmentFormValues = z.input<typeof equipmentForm>;

const emptyValues: EquipmentFormValues = {
  kind: 'return-pump',
  description: '',
  powerBoard: '',
  outlet: '',
  installedOn: '',
  lastServicedOn: '',
  maintenanceIntervalDays: '',
  notes: '',
};

function valuesOf(item: EquipmentItem): EquipmentFormValues {
  return {
    kind: item.kind,
    description: item.description,
    powerBoard: item.powerBoard ?? '',
    outlet: item.outlet ?? '',
    installedOn: item.installedOn ?? '',
    lastServicedOn: item.lastServicedOn ?? '',
    maintenanceIntervalDays: decimalDefault(item.maintenanceIntervalDays),
    notes: item.notes ?? '',
  };
}

function EquipmentForm({
  initial,
  submitLabel,
  onSubmit,
  onCancel,
}: {
  initial: EquipmentFormValues;
  submitLabel: string;
  /** Saves it; a rejected promise (an ApiError) puts its problems on the form. */
  onSubmit: (input: EquipmentInput) => Promise<unknown>;
  onCancel?: () => void;
}) {
  const form = useZodForm(equipmentForm, { defaultValues: initial });
  return (
    <Form form={form} onSubmit={onSubmit} className="space-y-4">
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField<EquipmentFormValues>
          name="kind"
          label="Kind"
          options={equipmentKinds.map((value) => ({ value, label: equipmentKindLabels[value] }))}
        />
        <TextField<EquipmentFormValues>
          name="description"
          label="Description"
          hint="What and where, e.g. “Return pump in the sump”"
          maxLength={200}
        />
        <TextField<EquipmentFormValues>
          name="powerBoard"
          label="Power board"
          hint="The label on the board, e.g. “B”"
          maxLength={24}
        />
        <TextField<EquipmentFormValues>
          name="outlet"
          label="Outlet"
          hint="The label on the outlet, e.g. “4”"
          maxLength={24}
        />
        <TextField<EquipmentFormValues> name="installedOn" label="Installed on" type="date" />
        <TextField<EquipmentFormValues> name="lastServicedOn" label="Last serviced on" type="date" />
        <TextField<EquipmentFormValues>
          name="maintenanceIntervalDays"
          label="Service every (days)"
          inputMode="numeric"
        />
      </div>
      <TextAreaField<EquipmentFormValues> name="notes" label="Notes" rows={2} maxLength={2000} />
      <FormProblem />
      <div className="flex flex-wrap gap-2">
        <SubmitButton pending="Saving…">{submitLabel}</SubmitButton>
        {onCancel && (
          <Button tone="secondary" onClick={onCancel}>
            Cancel
          </Button>
        )}
      </div>
    </Form>
  );
}

function EquipmentRow({ tankId, item }: { tankId: string; item: EquipmentItem }) {
  const [editing, setEditing] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const update = useUpdateEquipment(tankId);
  const remove = useDeleteEquipment(tankId);
  return (
    <li className="p-4">
      {editing ? (
        <EquipmentForm
          initial={valuesOf(item)}
          submitLabel="Save"
          onCancel={() => setEditing(false)}
          onSubmit={async (input) => {
            await update.mutateAsync({ equipmentId: item.id, input });
            setEditing(false);
          }}
        />
      ) : (
        <div className="flex flex-wrap items-center justify-between gap-3">
          <div className="min-w-0">
            <p className="font-bold text-ink-950">{item.description}</p>
            <p className="text-sm text-ink-700">
              {equipmentKindLabels[item.kind]}
              {item.powerBoard
                ? ` · board ${item.powerBoard}${item.outlet ? `, outlet ${item.outlet}` : ''}`
                : ' · not on a board'}
            </p>
          </div>
          <div className="flex gap-2">
            <Button tone="secondary" onClick={() => setEditing(true)}>
              Edit<span className="sr-only"> {item.description}</span>
            </Button>
            <Button
              tone="secondary"
              className="text-alert-700"
              disabled={remove.isPending}
              onClick={() => {
                remove.reset();
                setConfirming(true);
              }}
            >
              Delete<span className="sr-only"> {item.description}</span>
            </Button>
          </div>
          <ConfirmDialog
            open={confirming}
            title={`Delete “${item.description}”?`}
            confirmLabel="Delete"
            pendingLabel="Deleting…"
            pending={remove.isPending}
            error={remove.isError ? problemMessage(remove.error) : undefined}
            onClose={() => setConfirming(false)}
            onConfirm={() => remove.mutate(item.id, { onSuccess: () => setConfirming(false) })}
          >
            <p>It comes off the tank&apos;s equipment list and its power-board map.</p>
          </ConfirmDialog>
        </div>
      )}
    </li>
  );
}

/** Staff's editor: add equipment with its board and outlet labels, change or delete it. */
export function EquipmentEditor({
  tankId,
  equipment,
}: {
  tankId: string;
  equipment: readonly EquipmentItem[];
}) {
  const create = useCreateEquipment(tankId);
  const [formKey, setFormKey] = useState(0);
  return (
    <div className="space-y-6">
      <section aria-labelledby="add-equipment-title" className="rounded-card bg-white p-5 shadow-card">
        <h2 id="add-equipment-title" className="mb-3 text-xl font-bold text-ink-900">
          Add equipment
        </h2>
        <EquipmentForm
          key={formKey}
          initial={emptyValues}
          submitLabel="Add equipment"
          onSubmit={async (input) => {
            await create.mutateAsync(input);
            setFormKey((key) => key + 1);
          }}
        />
      </section>
      <section aria-labelledby="equipment-list-title">
        <h2 id="equipment-list-title" className="mb-3 text-xl font-bold text-ink-900">
          Recorded equipment
        </h2>
        {equipment.length === 0 ? (
          <p className="rounded-card border border-dashed border-ink-300 bg-white p-5 text-sm text-ink-700">
            Nothing recorded yet.
          </p>
        ) : (
          <ul className="divide-y divide-ink-100 rounded-card bg-white shadow-card">
            {equipment.map((item) => (
              <EquipmentRow key={item.id} tankId={tankId} item={item} />
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
