import { useEffect } from 'react';
import { useFormContext } from 'react-hook-form';
import { z } from 'zod';
import {
  tankStyle,
  tankStyleLabels,
  tankStyles,
  tankStyleWaterType,
} from '@shared/parameters/limit-templates';
import { waterType, type WaterType } from '@shared/parameters/water-types';
import {
  createTankInput,
  isoDate,
  tankDimensions,
  volumeUnit,
  type CreateTankInput,
  type TankDetail,
} from '@shared/schemas/tanks';
import { timeZone } from '@shared/time/time-zones';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import {
  CheckboxGroupField,
  DecimalField,
  SelectField,
  TextAreaField,
  TextField,
} from '../../../components/form-fields';
import { blankAsNull, decimalDefault, decimalText } from '../../../lib/form-values';
import { useClients } from '../../../lib/queries/people';
import { useTechnicians } from '../../../lib/queries/technicians';
import { VolumeFields } from './volume-fields';

const waterTypeLabels: Record<WaterType, string> = {
  marine: 'Marine',
  fresh: 'Freshwater',
  brackish: 'Brackish',
};

const timeZones = (() => {
  try {
    return Intl.supportedValuesOf('timeZone');
  } catch {
    return [];
  }
})();

const fields = createTankInput.shape;
const volume = (missing: string) =>
  decimalText(
    z
      .number({ error: (issue) => (issue.input === undefined ? missing : undefined) })
      .min(0, 'a volume cannot be negative'),
  );
const centimetres = decimalText(tankDimensions.shape.lengthCm.optional());

/** The tank form's text, read into exactly what the API takes (the shared create/update rules). */
const tankForm = z
  .object({
    name: fields.name,
    siteLabel: blankAsNull(fields.siteLabel),
    waterType,
    style: tankStyle,
    unit: volumeUnit,
    displayVolume: z.object({ value: volume('enter the volume as a number, e.g. 300') }),
    sumpVolume: z.object({ value: volume('enter the volume as a number, or 0 for no sump') }),
    dimensions: z
      .object({ lengthCm: centimetres, widthCm: centimetres, heightCm: centimetres })
      .superRefine((size, context) => {
        const given = Object.values(size).filter((value) => value !== undefined).length;
        if (given === 0 || given === 3) return;
        for (const [side, value] of Object.entries(size)) {
          if (value === undefined) {
            context.addIssue({
              code: 'custom',
              path: [side],
              message: 'give length, width and height in cm, or leave all three empty',
            });
          }
        }
      }),
    setUpOn: blankAsNull(isoDate.nullable()),
    assignedTechnicianId: blankAsNull(z.uuid().nullable()),
    serviceIntervalDays: decimalText(fields.serviceIntervalDays.unwrap().int('enter a whole number of days')),
    ownerIds: z.array(z.uuid()).max(20),
    notes: blankAsNull(fields.notes),
    timeZone: blankAsNull(timeZone.nullable()),
  })
  .transform(({ unit, displayVolume, sumpVolume, dimensions, ...rest }): CreateTankInput => ({
    ...rest,
    displayVolume: { value: displayVolume.value, unit },
    sumpVolume: { value: sumpVolume.value, unit },
    dimensions:
      dimensions.lengthCm !== undefined &&
      dimensions.widthCm !== undefined &&
      dimensions.heightCm !== undefined
        ? { lengthCm: dimensions.lengthCm, widthCm: dimensions.widthCm, heightCm: dimensions.heightCm }
        : null,
  }));
type TankFormValues = z.input<typeof tankForm>;

function defaultsOf(tank: TankDetail | undefined): TankFormValues {
  return {
    name: tank?.name ?? '',
    siteLabel: tank?.siteLabel ?? '',
    waterType: tank?.waterType ?? 'marine',
    style: tank?.style ?? 'mixed-reef',
    unit: 'litres',
    displayVolume: { value: decimalDefault(tank?.displayVolumeL) },
    sumpVolume: { value: tank ? decimalDefault(tank.sumpVolumeL) : '0' },
    dimensions: {
      lengthCm: decimalDefault(tank?.dimensions?.lengthCm),
      widthCm: decimalDefault(tank?.dimensions?.widthCm),
      heightCm: decimalDefault(tank?.dimensions?.heightCm),
    },
    setUpOn: tank?.setUpOn ?? '',
    assignedTechnicianId: tank?.assignedTechnician?.id ?? '',
    serviceIntervalDays: String(tank?.serviceIntervalDays ?? 14),
    ownerIds: tank?.owners.map((owner) => owner.id) ?? [],
    notes: tank?.notes ?? '',
    timeZone: tank?.timeZone ?? '',
  };
}

/** The server names a whole volume or size when its total is wrong; the form shows it at the number. */
function fieldFor(path: string): string {
  if (path === 'displayVolume' || path === 'sumpVolume') return `${path}.value`;
  if (path === 'dimensions') return 'dimensions.lengthCm';
  return path;
}

/** The style list follows the water; a style of another water gives way to the first that suits. */
function StyleField() {
  const { watch, getValues, setValue } = useFormContext<TankFormValues>();
  const water = watch('waterType');
  useEffect(() => {
    if (tankStyleWaterType[getValues('style')] === water) return;
    const style = tankStyles.find((option) => tankStyleWaterType[option] === water);
    if (style) setValue('style', style);
  }, [water, getValues, setValue]);
  return (
    <SelectField<TankFormValues>
      name="style"
      label="Style"
      hint="Sets the starting limits for the readings"
      options={tankStyles
        .filter((style) => tankStyleWaterType[style] === water)
        .map((value) => ({ value, label: tankStyleLabels[value] }))}
    />
  );
}

export function TankForm({
  tank,
  submitLabel,
  onSubmit,
}: {
  tank?: TankDetail;
  submitLabel: string;
  /** Sends the tank; a rejected promise (an ApiError) puts its problems on the form. */
  onSubmit: (input: CreateTankInput) => Promise<unknown>;
}) {
  const form = useZodForm(tankForm, { defaultValues: defaultsOf(tank) });
  const technicians = useTechnicians();
  const clients = useClients();

  return (
    <Form
      form={form}
      className="space-y-6 rounded-card bg-white p-5 shadow-card"
      fieldFor={fieldFor}
      onSubmit={onSubmit}
    >
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField<TankFormValues> name="name" label="Tank name" required maxLength={120} />
        <TextField<TankFormValues>
          name="siteLabel"
          label="Site"
          hint="Client and room, e.g. “Quayside Dental — waiting room”"
          maxLength={200}
        />
        <SelectField<TankFormValues>
          name="waterType"
          label="Water"
          options={(Object.keys(waterTypeLabels) as WaterType[]).map((value) => ({
            value,
            label: waterTypeLabels[value],
          }))}
        />
        <StyleField />
      </div>

      <VolumeFields />

      <fieldset className="rounded-lg border border-ink-100 p-4">
        <legend className="px-1 font-bold text-ink-900">Size in centimetres (optional)</legend>
        <div className="grid grid-cols-3 gap-3">
          <DecimalField<TankFormValues> name="dimensions.lengthCm" label="Length" />
          <DecimalField<TankFormValues> name="dimensions.widthCm" label="Width" />
          <DecimalField<TankFormValues> name="dimensions.heightCm" label="Height" />
        </div>
      </fieldset>

      <div className="grid gap-4 sm:grid-cols-3">
        <TextField<TankFormValues> name="setUpOn" label="Set up on" type="date" />
        <SelectField<TankFormValues>
          name="assignedTechnicianId"
          label="Technician"
          options={[
            { value: '', label: 'Nobody yet' },
            ...(technicians.data ?? []).map((person) => ({ value: person.id, label: person.name })),
          ]}
        />
        <TextField<TankFormValues>
          name="serviceIntervalDays"
          label="Visit every (days)"
          inputMode="numeric"
        />
      </div>

      <div className="rounded-lg border border-ink-100 p-4">
        {clients.isPending ? (
          <p className="text-sm text-ink-700">Loading clients…</p>
        ) : clients.isError ? (
          <p className="text-sm text-alert-700">The client list did not load; owners stay as they are.</p>
        ) : clients.data.length === 0 ? (
          <p className="text-sm text-ink-700">No clients yet. Invite them from the Clients page.</p>
        ) : (
          <CheckboxGroupField<TankFormValues>
            name="ownerIds"
            label="Owners who see this tank"
            columns="grid max-h-64 gap-1 overflow-y-auto sm:grid-cols-2"
            options={clients.data.map((client) => ({
              value: client.id,
              label: (
                <span>
                  {client.name} <span className="font-normal text-ink-700">({client.email})</span>
                </span>
              ),
            }))}
          />
        )}
      </div>

      <SelectField<TankFormValues>
        name="timeZone"
        label="Time zone"
        hint="Only when the tank is somewhere other than the company"
        options={[
          { value: '', label: "The company's time zone" },
          ...timeZones.map((zone) => ({ value: zone, label: zone.replaceAll('_', ' ') })),
        ]}
      />

      <TextAreaField<TankFormValues>
        name="notes"
        label="Notes"
        hint="The owners see these too: access, feeding, anything the next visit should know."
        rows={4}
        maxLength={4000}
      />

      <FormProblem />
      <div className="flex flex-wrap gap-3">
        <SubmitButton pending="Saving…">{submitLabel}</SubmitButton>
      </div>
    </Form>
  );
}
