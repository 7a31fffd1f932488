import { useMemo, useState, type FormEvent } from 'react';
import {
  tankStyleLabels,
  tankStyles,
  tankStyleWaterType,
  type TankStyle,
} from '@shared/parameters/limit-templates';
import type { WaterType } from '@shared/schemas/species';
import type { CreateTankInput, TankDetail, VolumeUnit } from '@shared/schemas/tanks';
import { Button } from '../../../components/button';
import {
  CheckboxField,
  FieldError,
  SelectField,
  TextAreaField,
  TextField,
} from '../../../components/form-fields';
import { ApiError } from '../../../lib/api-client';
import { parseUnsignedDecimal } from '../../../lib/decimal';
import { fieldErrors } from '../../../lib/form-issues';
import { useClients } from '../../clients/api/list-clients';
import { useTechnicians } from '../api/get-technicians';
import { VolumeFields } from './volume-fields';

const waterTypeLabels: Record<WaterType, string> = {
  marine: 'Marine',
  fresh: 'Freshwater',
  brackish: 'Brackish',
};

interface FormState {
  name: string;
  siteLabel: string;
  waterType: WaterType;
  style: TankStyle;
  unit: VolumeUnit;
  display: string;
  sump: string;
  lengthCm: string;
  widthCm: string;
  heightCm: string;
  setUpOn: string;
  assignedTechnicianId: string;
  serviceIntervalDays: string;
  ownerIds: string[];
  notes: string;
  timeZone: string;
}

function initialState(tank: TankDetail | undefined): FormState {
  return {
    name: tank?.name ?? '',
    siteLabel: tank?.siteLabel ?? '',
    waterType: tank?.waterType ?? 'marine',
    style: tank?.style ?? 'mixed-reef',
    unit: 'litres',
    display: tank ? String(tank.displayVolumeL) : '',
    sump: tank ? String(tank.sumpVolumeL) : '0',
    lengthCm: tank?.dimensions ? String(tank.dimensions.lengthCm) : '',
    widthCm: tank?.dimensions ? String(tank.dimensions.widthCm) : '',
    heightCm: tank?.dimensions ? String(tank.dimensions.heightCm) : '',
    setUpOn: tank?.setUpOn ?? '',
    assignedTechnicianId: tank?.assignedTechnician?.id ?? '',
    serviceIntervalDays: String(tank?.serviceIntervalDays ?? 14),
    ownerIds: tank?.owners.map((owner) => owner.id) ?? [],
    notes: tank?.notes ?? '',
    timeZone: tank?.timeZone ?? '',
  };
}

const timeZones = (() => {
  try {
    return Intl.supportedValuesOf('timeZone');
  } catch {
    return [];
  }
})();

/** Numbers are read here, so a typing slip is named beside its field before anything is sent. */
function toInput(state: FormState): { input: CreateTankInput | null; errors: Record<string, string> } {
  const errors: Record<string, string> = {};
  const display = parseUnsignedDecimal(state.display);
  const sump = state.sump.trim() === '' ? 0 : parseUnsignedDecimal(state.sump);
  if (display === null) errors['displayVolume.value'] = 'enter the volume as a number, e.g. 300';
  if (sump === null) errors['sumpVolume.value'] = 'enter the volume as a number, or 0 for no sump';
  const dims = [state.lengthCm, state.widthCm, state.heightCm].map((text) =>
    text.trim() === '' ? null : parseUnsignedDecimal(text),
  );
  const anyDim = [state.lengthCm, state.widthCm, state.heightCm].some((text) => text.trim() !== '');
  if (anyDim && dims.some((value) => value === null))
    errors.dimensions = 'give length, width and height in cm, or leave all three empty';
  const interval = Number(state.serviceIntervalDays);
  if (!Number.isInteger(interval)) errors.serviceIntervalDays = 'enter a whole number of days';
  if (Object.keys(errors).length > 0) return { input: null, errors };
  return {
    input: {
      name: state.name,
      siteLabel: state.siteLabel.trim() || null,
      waterType: state.waterType,
      style: state.style,
      displayVolume: { value: display!, unit: state.unit },
      sumpVolume: { value: sump!, unit: state.unit },
      dimensions: anyDim ? { lengthCm: dims[0]!, widthCm: dims[1]!, heightCm: dims[2]! } : null,
      setUpOn: state.setUpOn || null,
      assignedTechnicianId: state.assignedTechnicianId || null,
      serviceIntervalDays: interval,
      ownerIds: state.ownerIds,
      notes: state.notes.trim() || null,
      timeZone: state.timeZone || null,
    },
    errors,
  };
}

export function TankForm({
  tank,
  submitLabel,
  pending,
  error,
  onSubmit,
}: {
  tank?: TankDetail;
  submitLabel: string;
  pending: boolean;
  error: unknown;
  onSubmit: (input: CreateTankInput) => void;
}) {
  const [state, setState] = useState<FormState>(() => initialState(tank));
  const [localErrors, setLocalErrors] = useState<Record<string, string>>({});
  const technicians = useTechnicians();
  const clients = useClients();
  const set = <K extends keyof FormState>(key: K, value: FormState[K]) =>
    setState((prev) => ({ ...prev, [key]: value }));

  const serverErrors = useMemo(() => (error instanceof ApiError ? fieldErrors(error.issues) : {}), [error]);
  const errors = { ...serverErrors, ...localErrors };
  const styles = tankStyles.filter((style) => tankStyleWaterType[style] === state.waterType);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const { input, errors: found } = toInput(state);
    setLocalErrors(found);
    if (input) onSubmit(input);
  };

  return (
    <form onSubmit={submit} noValidate className="space-y-6 rounded-card bg-white p-5 shadow-card">
      {error instanceof ApiError && (
        <div
          role="alert"
          className="rounded-lg border border-alert-700/30 bg-alert-100 p-4 font-bold text-alert-700"
        >
          {error.status === 400 ? 'Some fields need attention: see the messages beside them.' : error.message}
        </div>
      )}
      {error !== null && error !== undefined && !(error instanceof ApiError) && (
        <div role="alert" className="rounded-lg bg-alert-100 p-4 font-bold text-alert-700">
          The tank could not be saved. Please try again.
        </div>
      )}
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField
          label="Tank name"
          value={state.name}
          onChange={(value) => set('name', value)}
          error={errors.name}
          required
          maxLength={120}
        />
        <TextField
          label="Site"
          hint="Client and room, e.g. “Quayside Dental — waiting room”"
          value={state.siteLabel}
          onChange={(value) => set('siteLabel', value)}
          error={errors.siteLabel}
          maxLength={200}
        />
        <SelectField
          label="Water"
          value={state.waterType}
          onChange={(value) => {
            const waterType = value as WaterType;
            const style =
              tankStyles.find((option) => tankStyleWaterType[option] === waterType) ?? state.style;
            setState((prev) => ({
              ...prev,
              waterType,
              style: tankStyleWaterType[prev.style] === waterType ? prev.style : style,
            }));
          }}
          options={(Object.keys(waterTypeLabels) as WaterType[]).map((value) => ({
            value,
            label: waterTypeLabels[value],
          }))}
          error={errors.waterType}
        />
        <SelectField
          label="Style"
          hint="Sets the starting limits for the readings"
          value={state.style}
          onChange={(value) => set('style', value as TankStyle)}
          options={styles.map((value) => ({ value, label: tankStyleLabels[value] }))}
          error={errors.style}
        />
      </div>

      <VolumeFields
        unit={state.unit}
        display={state.display}
        sump={state.sump}
        onChange={(next) => setState((prev) => ({ ...prev, ...next }))}
        errors={errors}
      />

      <fieldset className="rounded-lg border border-ink-100 p-4">
        <legend className="px-1 font-bold text-ink-900">Size in centimetres (optional)</legend>
        <div className="grid grid-cols-3 gap-3">
          <TextField
            label="Length"
            inputMode="decimal"
            value={state.lengthCm}
            onChange={(value) => set('lengthCm', value)}
          />
          <TextField
            label="Width"
            inputMode="decimal"
            value={state.widthCm}
            onChange={(value) => set('widthCm', value)}
          />
          <TextField
            label="Height"
            inputMode="decimal"
            value={state.heightCm}
            onChange={(value) => set('heightCm', value)}
          />
        </div>
        {(errors.dimensions ??
          errors['dimensions.lengthCm'] ??
          errors['dimensions.widthCm'] ??
          errors['dimensions.heightCm']) && (
          <FieldError className="mt-1">
            {errors.dimensions ??
              errors['dimensions.lengthCm'] ??
              errors['dimensions.widthCm'] ??
              errors['dimensions.heightCm']}
          </FieldError>
        )}
      </fieldset>

      <div className="grid gap-4 sm:grid-cols-3">
        <TextField
          label="Set up on"
          type="date"
          value={state.setUpOn}
          onChange={(value) => set('setUpOn', value)}
          error={errors.setUpOn}
        />
        <SelectField
          label="Technician"
          value={state.assignedTechnicianId}
          onChange={(value) => set('assignedTechnicianId', value)}
          options={[
            { value: '', label: 'Nobody yet' },
            ...(technicians.data ?? []).map((person) => ({ value: person.id, label: person.name })),
          ]}
          error={errors.assignedTechnicianId}
        />
        <TextField
          label="Visit every (days)"
          inputMode="numeric"
          value={state.serviceIntervalDays}
          onChange={(value) => set('serviceIntervalDays', value)}
          error={errors.serviceIntervalDays}
        />
      </div>

      <fieldset
        className="rounded-lg border border-ink-100 p-4"
        aria-describedby={errors.ownerIds ? 'owners-error' : undefined}
      >
        <legend className="px-1 font-bold text-ink-900">Owners who see this tank</legend>
        {clients.isPending ? (
          <p className="text-sm text-ink-700">Loading clients…</p>
        ) : clients.isError ? (
          <p className="text-sm text-alert-700">The client list did not load; owners stay as they are.</p>
        ) : clients.data.length === 0 ? (
          <p className="text-sm text-ink-700">No clients yet. Invite them from the Clients page.</p>
        ) : (
          <div className="grid max-h-64 gap-1 overflow-y-auto sm:grid-cols-2">
            {clients.data.map((client) => (
              <CheckboxField
                key={client.id}
                label={
                  <span>
                    {client.name} <span className="font-normal text-ink-700">({client.email})</span>
                  </span>
                }
                checked={state.ownerIds.includes(client.id)}
                onChange={(checked) =>
                  set(
                    'ownerIds',
                    checked
                      ? [...state.ownerIds, client.id]
                      : state.ownerIds.filter((id) => id !== client.id),
                  )
                }
              />
            ))}
          </div>
        )}
        {errors.ownerIds && (
          <FieldError id="owners-error" className="mt-1">
            {errors.ownerIds}
          </FieldError>
        )}
      </fieldset>

      <SelectField
        label="Time zone"
        hint="Only when the tank is somewhere other than the company"
        value={state.timeZone}
        onChange={(value) => set('timeZone', value)}
        options={[
          { value: '', label: "The company's time zone" },
          ...timeZones.map((zone) => ({ value: zone, label: zone.replaceAll('_', ' ') })),
        ]}
        error={errors.timeZone}
      />

      <TextAreaField
        label="Notes"
        hint="The owners see these too: access, feeding, anything the next visit should know."
        value={state.notes}
        onChange={(value) => set('notes', value)}
        error={errors.notes}
        rows={4}
        maxLength={4000}
      />

      <div className="flex flex-wrap gap-3">
        <Button type="submit" disabled={pending}>
          {pending ? 'Saving…' : submitLabel}
        </Button>
      </div>
    </form>
  );
}
