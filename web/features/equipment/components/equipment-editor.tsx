import { useState, type FormEvent } from 'react';
import {
  equipmentKindLabels,
  equipmentKinds,
  type EquipmentInput,
  type EquipmentItem,
  type EquipmentKind,
} from '@shared/schemas/equipment';
import { Button } from '../../../components/button';
import { SelectField, TextAreaField, TextField } from '../../../components/form-fields';
import { ApiError } from '../../../lib/api-client';
import { fieldErrors } from '../../../lib/form-issues';
import { useCreateEquipment } from '../api/create-equipment';
import { useDeleteEquipment } from '../api/delete-equipment';
import { useUpdateEquipment } from '../api/update-equipment';

interface FormValues {
  kind: EquipmentKind;
  description: string;
  powerBoard: string;
  outlet: string;
  installedOn: string;
  lastServicedOn: string;
  maintenanceIntervalDays: string;
  notes: string;
}

const emptyValues: FormValues = {
  kind: 'return-pump',
  description: '',
  powerBoard: '',
  outlet: '',
  installedOn: '',
  lastServicedOn: '',
  maintenanceIntervalDays: '',
  notes: '',
};

function valuesOf(item: EquipmentItem): FormValues {
  return {
    kind: item.kind,
    description: item.description,
    powerBoard: item.powerBoard ?? '',
    outlet: item.outlet ?? '',
    installedOn: item.installedOn ?? '',
    lastServicedOn: item.lastServicedOn ?? '',
    maintenanceIntervalDays:
      item.maintenanceIntervalDays === null ? '' : String(item.maintenanceIntervalDays),
    notes: item.notes ?? '',
  };
}

function inputOf(values: FormValues): EquipmentInput {
  const interval = values.maintenanceIntervalDays.trim();
  return {
    kind: values.kind,
    description: values.description,
    powerBoard: values.powerBoard.trim() || null,
    outlet: values.outlet.trim() || null,
    installedOn: values.installedOn || null,
    lastServicedOn: values.lastServicedOn || null,
    maintenanceIntervalDays: interval === '' ? null : Number(interval),
    notes: values.notes.trim() || null,
  };
}

function EquipmentForm({
  initial,
  submitLabel,
  pending,
  error,
  onSubmit,
  onCancel,
}: {
  initial: FormValues;
  submitLabel: string;
  pending: boolean;
  error: unknown;
  onSubmit: (input: EquipmentInput) => void;
  onCancel?: () => void;
}) {
  const [values, setValues] = useState(initial);
  const set = <K extends keyof FormValues>(key: K, value: FormValues[K]) =>
    setValues((prev) => ({ ...prev, [key]: value }));
  const errors = error instanceof ApiError ? fieldErrors(error.issues) : {};
  const submit = (event: FormEvent) => {
    event.preventDefault();
    onSubmit(inputOf(values));
  };
  return (
    <form onSubmit={submit} noValidate className="space-y-4">
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField
          label="Kind"
          value={values.kind}
          onChange={(value) => set('kind', value as EquipmentKind)}
          options={equipmentKinds.map((value) => ({ value, label: equipmentKindLabels[value] }))}
          error={errors.kind}
        />
        <TextField
          label="Description"
          hint="What and where, e.g. “Return pump in the sump”"
          value={values.description}
          onChange={(value) => set('description', value)}
          error={errors.description}
          maxLength={200}
        />
        <TextField
          label="Power board"
          hint="The label on the board, e.g. “B”"
          value={values.powerBoard}
          onChange={(value) => set('powerBoard', value)}
          error={errors.powerBoard}
          maxLength={24}
        />
        <TextField
          label="Outlet"
          hint="The label on the outlet, e.g. “4”"
          value={values.outlet}
          onChange={(value) => set('outlet', value)}
          error={errors.outlet}
          maxLength={24}
        />
        <TextField
          label="Installed on"
          type="date"
          value={values.installedOn}
          onChange={(value) => set('installedOn', value)}
          error={errors.installedOn}
        />
        <TextField
          label="Last serviced on"
          type="date"
          value={values.lastServicedOn}
          onChange={(value) => set('lastServicedOn', value)}
          error={errors.lastServicedOn}
        />
        <TextField
          label="Service every (days)"
          inputMode="numeric"
          value={values.maintenanceIntervalDays}
          onChange={(value) => set('maintenanceIntervalDays', value)}
          error={errors.maintenanceIntervalDays}
        />
      </div>
      <TextAreaField
        label="Notes"
        value={values.notes}
        onChange={(value) => set('notes', value)}
        rows={2}
        maxLength={2000}
        error={errors.notes}
      />
      {error !== null && error !== undefined && (
        <p role="alert" className="font-bold text-alert-700">
          {error instanceof ApiError && error.status === 400
            ? 'Some fields need attention.'
            : 'It could not be saved. Please try again.'}
        </p>
      )}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" disabled={pending}>
          {pending ? 'Saving…' : submitLabel}
        </Button>
        {onCancel && (
          <Button tone="secondary" onClick={onCancel}>
            Cancel
          </Button>
        )}
      </div>
    </form>
  );
}

function EquipmentRow({ tankId, item }: { tankId: string; item: EquipmentItem }) {
  const [editing, setEditing] = useState(false);
  const update = useUpdateEquipment(tankId);
  const remove = useDeleteEquipment(tankId);
  return (
    <li className="p-4">
      {editing ? (
        <EquipmentForm
          initial={valuesOf(item)}
          submitLabel="Save"
          pending={update.isPending}
          error={update.error}
          onCancel={() => setEditing(false)}
          onSubmit={(input) =>
            update.mutate({ equipmentId: item.id, input }, { onSuccess: () => setEditing(false) })
          }
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
                if (window.confirm(`Delete “${item.description}”?`)) remove.mutate(item.id);
              }}
            >
              Delete<span className="sr-only"> {item.description}</span>
            </Button>
          </div>
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
          pending={create.isPending}
          error={create.error}
          onSubmit={(input) =>
            create.mutate(input, {
              onSuccess: () => {
                create.reset();
                setFormKey((key) => key + 1);
              },
            })
          }
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
