import { useId, useState } from 'react';
import { z } from 'zod';
import { useFieldArray, useFormContext, useWatch } from 'react-hook-form';
import { priceItemKindLabels } from '@shared/billing/invoices';
import { concentrationAfterWaterChanges } from '@shared/chemistry/index';
import { parametersFor, parameterCatalogue } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import { allowedUnits } from '@shared/parameters/units';
import type { WaterType } from '@shared/parameters/water-types';
import {
  equipmentCheckStateLabels,
  equipmentCheckStates,
  visitTaskLabels,
  visitTasks,
  type CarriedItem,
  type LivestockChange,
} from '@shared/schemas/visits';
import { Button } from '../../../components/button';
import { SectionCard } from '../../../components/section-card';
import { CompatibilityWarnings } from '../../../components/compatibility-warnings';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { FieldError } from '../../../components/field-error';
import {
  CheckboxField,
  CheckboxGroupField,
  DecimalField,
  RadioGroupField,
  SelectField,
  TextAreaField,
  TextField,
} from '../../../components/form-fields';
import { Markdown } from '../../../components/markdown';
import { SheetDialog } from '../../../components/sheet-dialog';
import { parseDecimal } from '../../../lib/decimal';
import { blankAsUndefined, decimalDefault, decimalText } from '../../../lib/form-values';
import { formatNumber } from '../../../lib/format';
import { useLatestReadings } from '../../../lib/queries/latest-readings';
import { useEquipment } from '../../../lib/queries/equipment';
import { useLivestock } from '../../../lib/queries/livestock';
import { useOnline } from '../../../lib/use-online';
import { useCompatibility, useSpeciesSearch } from '../api/get-report-context';
import { usePriceList } from '../../../lib/queries/price-list';
import { litresFor, percentFor, quantityUsed, wallText, type ReportFormValues } from '../utils/report-form';

const nowIn = (zone: string) => wallText(new Date().toISOString(), zone);

export function TimesSection({ zone }: { zone: string }) {
  const { setValue } = useFormContext<ReportFormValues>();
  return (
    <SectionCard title="Time on site" hint={`Times are the tank’s local time (${zone.replace(/_/g, ' ')}).`}>
      <div className="grid gap-3 sm:grid-cols-2">
        {(['arrivedAt', 'departedAt'] as const).map((name) => (
          <div key={name} className="flex flex-wrap items-end gap-2">
            <TextField<ReportFormValues>
              name={name}
              label={name === 'arrivedAt' ? 'Arrived' : 'Left'}
              type="datetime-local"
              className="min-w-[16.5rem] flex-1"
            />
            <Button
              tone="secondary"
              className="mb-0.5 shrink-0"
              onClick={() => setValue(name, nowIn(zone), { shouldDirty: true, shouldValidate: true })}
            >
              Now
            </Button>
          </div>
        ))}
      </div>
    </SectionCard>
  );
}

/** Items earlier visits left for this one; ticking one closes it when the report is published. */
export function CarriedItemsSection({ items }: { items: readonly CarriedItem[] }) {
  if (items.length === 0) return null;
  return (
    <SectionCard title="Carried from earlier visits" hint="Tick what you finished today.">
      <CheckboxGroupField<ReportFormValues>
        name="closedItemIds"
        label="Open items"
        columns="mt-1 grid gap-2"
        options={items.map((item) => ({ value: item.id, label: item.text }))}
      />
    </SectionCard>
  );
}

export function ChecklistSection({
  tankId,
  systemVolumeL,
  waterType,
}: {
  tankId: string;
  systemVolumeL: number;
  waterType: WaterType;
}) {
  const tasks = useWatch<ReportFormValues, 'tasksDone'>({ name: 'tasksDone' });
  return (
    <SectionCard title="What was done" hint="Tick each task; the ones with details open below it.">
      <CheckboxGroupField<ReportFormValues>
        name="tasksDone"
        label="Tasks"
        columns="mt-1 grid gap-2 sm:grid-cols-2"
        options={visitTasks.map((task) => ({ value: task, label: visitTaskLabels[task] }))}
      />
      {tasks.includes('water-change') && (
        <WaterChangeFields tankId={tankId} systemVolumeL={systemVolumeL} waterType={waterType} />
      )}
      {tasks.includes('dosing-refill') && <DosingFields />}
      {tasks.includes('equipment-check') && <EquipmentFields tankId={tankId} />}
    </SectionCard>
  );
}

const numberOf = (text: string) => {
  const parsed = parseDecimal(text);
  return parsed.state === 'number' ? parsed.value : null;
};

/**
 * Percentage and litres, each computed from the other with display + sump volume, and what the
 * change should do to nitrate and phosphate: the mass balance in shared/chemistry (an estimate:
 * it assumes full mixing and new water free of both).
 */
function WaterChangeFields({
  tankId,
  systemVolumeL,
  waterType,
}: {
  tankId: string;
  systemVolumeL: number;
  waterType: WaterType;
}) {
  const { setValue } = useFormContext<ReportFormValues>();
  const percentText = useWatch<ReportFormValues, 'waterChange.percent'>({ name: 'waterChange.percent' });
  const latest = useLatestReadings(tankId);
  const percent = numberOf(percentText);
  const fraction = percent !== null && percent > 0 && percent <= 100 ? percent / 100 : null;
  const estimates = (['nitrate', 'phosphate'] as const).flatMap((parameter) => {
    const reading = latest.data?.parameters.find((p) => p.parameter === parameter)?.latest;
    if (!reading || fraction === null) return [];
    const after = concentrationAfterWaterChanges(reading.value, 0, fraction);
    return [{ parameter, before: reading.value, after }];
  });
  const sync = (from: 'percent' | 'litres', text: string) => {
    const value = numberOf(text);
    if (value === null || systemVolumeL <= 0) return;
    if (from === 'percent')
      setValue('waterChange.litres', String(litresFor(value, systemVolumeL)), { shouldDirty: true });
    else setValue('waterChange.percent', String(percentFor(value, systemVolumeL)), { shouldDirty: true });
  };
  return (
    <fieldset className="grid gap-3 rounded-lg border border-ink-100 p-3">
      <legend className="px-1 font-bold text-ink-900">Water change</legend>
      <p className="text-sm text-ink-700">
        System volume {formatNumber(systemVolumeL, 0)} L (display + sump). Type either figure; the other
        follows.
      </p>
      <div className="grid grid-cols-2 gap-3">
        <DecimalField<ReportFormValues>
          name="waterChange.percent"
          label="Share"
          suffix="%"
          onInput={(event) => sync('percent', event.currentTarget.value)}
        />
        <DecimalField<ReportFormValues>
          name="waterChange.litres"
          label="Volume"
          suffix="L"
          onInput={(event) => sync('litres', event.currentTarget.value)}
        />
      </div>
      {waterType !== 'fresh' && (
        <DecimalField<ReportFormValues>
          name="waterChange.newSalinityPpt"
          label="New water’s salinity"
          hint="As mixed, before it went in."
          suffix="ppt"
        />
      )}
      {estimates.length > 0 && (
        <div className="rounded-lg bg-brine-100 p-3 text-sm text-ink-900">
          <p className="font-bold">Estimate after this change</p>
          <ul className="mt-1">
            {estimates.map((e) => (
              <li key={e.parameter}>
                {parameterCatalogue[e.parameter].label}: {formatNumber(e.before, 2)} → about{' '}
                {formatNumber(e.after, 2)} mg/L
              </li>
            ))}
          </ul>
          <p className="mt-1 text-ink-700">
            Estimated by mass balance from the latest readings, assuming full mixing and new water with none
            of either; test to confirm.
          </p>
        </div>
      )}
    </fieldset>
  );
}

function DosingFields() {
  const { fields, append, remove } = useFieldArray<ReportFormValues, 'dosingRefills'>({
    name: 'dosingRefills',
  });
  return (
    <fieldset className="grid gap-3 rounded-lg border border-ink-100 p-3">
      <legend className="px-1 font-bold text-ink-900">Dosing containers refilled</legend>
      {fields.map((field, index) => (
        <div
          key={field.id}
          className="grid grid-cols-[1fr_7rem] items-end gap-2 sm:grid-cols-[1fr_9rem_auto]"
        >
          <TextField<ReportFormValues> name={`dosingRefills.${index}.container`} label="Container" />
          <DecimalField<ReportFormValues>
            name={`dosingRefills.${index}.amountMl`}
            label="Amount"
            suffix="mL"
          />
          <Button tone="secondary" className="col-span-2 sm:col-span-1" onClick={() => remove(index)}>
            Remove
          </Button>
        </div>
      ))}
      <Button tone="secondary" onClick={() => append({ container: '', amountMl: '' })}>
        Add a container
      </Button>
    </fieldset>
  );
}

function EquipmentFields({ tankId }: { tankId: string }) {
  const equipment = useEquipment(tankId);
  const checks = useWatch<ReportFormValues, 'equipmentChecks'>({ name: 'equipmentChecks' });
  if (equipment.isPending) return <p className="text-ink-700">Loading the tank’s equipment…</p>;
  if (equipment.isError) return <p className="text-alert-700">The equipment list could not be loaded.</p>;
  const names = new Map(equipment.data.map((item) => [item.id, item]));
  if (checks.length === 0) return <p className="text-ink-700">No equipment is recorded for this tank yet.</p>;
  return (
    <fieldset className="grid gap-3 rounded-lg border border-ink-100 p-3">
      <legend className="px-1 font-bold text-ink-900">Equipment checked</legend>
      {checks.map((check, index) => {
        const item = names.get(check.equipmentId);
        const where = item?.powerBoard
          ? ` · board ${item.powerBoard}${item.outlet ? `, outlet ${item.outlet}` : ''}`
          : '';
        return (
          <div key={check.equipmentId} className="grid gap-2">
            <RadioGroupField<ReportFormValues>
              name={`equipmentChecks.${index}.state`}
              label={`${item?.description ?? 'Removed equipment'}${where}`}
              look="compact"
              options={[
                { value: '', label: 'Not checked' },
                ...equipmentCheckStates.map((state) => ({
                  value: state,
                  label: equipmentCheckStateLabels[state],
                })),
              ]}
            />
            {check.state !== '' && check.state !== 'ok' && (
              <TextField<ReportFormValues>
                name={`equipmentChecks.${index}.note`}
                label="What was found or fitted"
              />
            )}
          </div>
        );
      })}
    </fieldset>
  );
}

export function ReadingsSection({
  waterType,
  arrivedAt,
}: {
  waterType: WaterType;
  arrivedAt: () => string | null;
}) {
  const { fields, append, remove } = useFieldArray<ReportFormValues, 'readings'>({ name: 'readings' });
  const readings = useWatch<ReportFormValues, 'readings'>({ name: 'readings' });
  const parameters = parametersFor(waterType);
  return (
    <SectionCard
      title="Readings taken"
      hint="Stored with the tank’s readings when the report is published, and checked against its limits."
    >
      {fields.map((field, index) => {
        const parameter = (readings[index]?.parameter ?? field.parameter) as ParameterKey;
        // Specific gravity needs two instrument temperatures; the readings screen takes those.
        const units = allowedUnits(parameter).filter((unit) => unit !== 'specific gravity');
        return (
          <div key={field.id} className="grid grid-cols-2 items-end gap-2 sm:grid-cols-[1fr_8rem_10rem_auto]">
            <SelectField<ReportFormValues>
              name={`readings.${index}.parameter`}
              label="Parameter"
              className="col-span-2 sm:col-span-1"
              options={parameters.map((p) => ({ value: p, label: parameterCatalogue[p].label }))}
            />
            <DecimalField<ReportFormValues> name={`readings.${index}.value`} label="Value" />
            <SelectField<ReportFormValues>
              name={`readings.${index}.unit`}
              label="Unit"
              options={units.map((unit) => ({ value: unit, label: unit }))}
            />
            <Button tone="secondary" className="col-span-2 sm:col-span-1" onClick={() => remove(index)}>
              Remove
            </Button>
          </div>
        );
      })}
      <Button
        tone="secondary"
        onClick={() => {
          const parameter =
            parameters.find((p) => !readings.some((r) => r.parameter === p)) ?? parameters[0]!;
          append({
            parameter,
            value: '',
            unit: allowedUnits(parameter)[0]!,
            measuredAt: arrivedAt() ?? new Date().toISOString(),
          });
        }}
      >
        Add a reading
      </Button>
    </SectionCard>
  );
}

const changeWords: Record<LivestockChange['action'], string> = {
  add: 'Added',
  remove: 'Removed',
  move: 'Moved',
};

export function LivestockSection({ tankId, waterType }: { tankId: string; waterType: WaterType }) {
  const { fields, append, remove } = useFieldArray<ReportFormValues, 'livestockChanges'>({
    name: 'livestockChanges',
  });
  const changes = useWatch<ReportFormValues, 'livestockChanges'>({ name: 'livestockChanges' });
  const livestock = useLivestock(tankId);
  const [adding, setAdding] = useState<'add' | 'remove' | 'move' | null>(null);
  const present = (livestock.data ?? []).filter(
    (item) => item.status !== 'removed' && item.status !== 'died',
  );
  const nameOf = (id: string) => {
    const item = livestock.data?.find((l) => l.id === id);
    return item
      ? `${item.nickname ? `${item.nickname} (${item.species.commonName})` : item.species.commonName}`
      : 'Livestock';
  };
  return (
    <SectionCard
      title="Livestock"
      hint="Written to the tank’s livestock and its history when the report is published."
    >
      {fields.length > 0 && (
        <ul className="grid gap-2">
          {fields.map((field, index) => {
            const change = changes[index] ?? field;
            return (
              <li
                key={field.id}
                className="flex flex-wrap items-center justify-between gap-2 rounded-lg border border-ink-100 p-3"
              >
                <span className="text-ink-900">
                  <strong>{changeWords[change.action]}</strong>{' '}
                  {change.action === 'add'
                    ? `${change.quantity} × ${change.nickname || change.speciesId.replace(/^company-/, '')}`
                    : nameOf(change.livestockId)}
                  {change.action === 'move' && ` to ${change.placement}`}
                  {change.action === 'add' && change.acknowledgeWarnings && ' (warnings read)'}
                </span>
                <Button tone="secondary" onClick={() => remove(index)}>
                  Undo
                </Button>
              </li>
            );
          })}
        </ul>
      )}
      {adding === null ? (
        <div className="flex flex-wrap gap-2">
          <Button tone="secondary" onClick={() => setAdding('add')}>
            Add livestock
          </Button>
          <Button tone="secondary" onClick={() => setAdding('remove')} disabled={present.length === 0}>
            Remove livestock
          </Button>
          <Button tone="secondary" onClick={() => setAdding('move')} disabled={present.length === 0}>
            Move livestock
          </Button>
        </div>
      ) : adding === 'add' ? (
        <AddLivestock
          tankId={tankId}
          waterType={waterType}
          onDone={(change) => {
            if (change) append(change);
            setAdding(null);
          }}
        />
      ) : (
        <PickLivestock
          action={adding}
          options={present.map((item) => ({ value: item.id, label: nameOf(item.id) }))}
          onDone={(change) => {
            if (change) append(change);
            setAdding(null);
          }}
        />
      )}
    </SectionCard>
  );
}

const addLivestockForm = z.object({
  speciesId: z.string().min(1, 'choose a species from the list'),
  quantity: decimalText(z.int('a whole number').min(1, 'at least 1').max(1000, 'at most 1000')),
  placement: blankAsUndefined(z.string().trim().max(120).optional()),
  acknowledgeWarnings: z.boolean(),
});

/** Adding an animal: search, pick, see the compatibility warnings, accept them or not. */
function AddLivestock({
  tankId,
  waterType,
  onDone,
}: {
  tankId: string;
  waterType: WaterType;
  onDone: (change: LivestockChange | null) => void;
}) {
  const id = useId();
  const [q, setQ] = useState('');
  const form = useZodForm(addLivestockForm, {
    defaultValues: { speciesId: '', quantity: '1', placement: '', acknowledgeWarnings: false },
  });
  const speciesId = useWatch({ control: form.control, name: 'speciesId' });
  const results = useSpeciesSearch(q, waterType);
  const check = useCompatibility(tankId, speciesId === '' ? null : speciesId);
  const warnings = check.data?.warnings ?? [];
  return (
    <SheetDialog title="Add livestock" onClose={() => onDone(null)}>
      <Form
        form={form}
        className="grid gap-3"
        onSubmit={(values) => {
          if (warnings.length > 0 && !values.acknowledgeWarnings) {
            form.setError('acknowledgeWarnings', { message: 'read the warnings and tick to add it anyway' });
            return;
          }
          onDone({
            action: 'add',
            speciesId: values.speciesId,
            quantity: values.quantity,
            ...(values.placement ? { placement: values.placement } : {}),
            ...(warnings.length > 0 ? { acknowledgeWarnings: true } : {}),
          });
        }}
      >
        <div>
          <label htmlFor={`${id}-q`} className="block font-bold text-ink-900">
            Find the species
          </label>
          <input
            id={`${id}-q`}
            type="search"
            value={q}
            onChange={(event) => {
              setQ(event.target.value);
              form.setValue('speciesId', '');
              form.setValue('acknowledgeWarnings', false);
            }}
            placeholder="Two letters of its name"
            autoComplete="off"
            className="mt-1 min-h-11 w-full rounded-lg border-2 border-ink-300 px-3"
          />
        </div>
        {results.data && results.data.length === 0 && (
          <p className="text-ink-700">No species match that name.</p>
        )}
        {results.data && results.data.length > 0 && (
          <RadioGroupField<z.input<typeof addLivestockForm>>
            name="speciesId"
            label="Species"
            look="rows"
            options={results.data.map((species) => ({
              value: species.id,
              label: species.commonName,
              hint: <span className="italic">{species.scientificName}</span>,
            }))}
          />
        )}
        <div className="grid grid-cols-[6rem_1fr] gap-2">
          <DecimalField<z.input<typeof addLivestockForm>>
            name="quantity"
            label="How many"
            inputMode="numeric"
          />
          <TextField<z.input<typeof addLivestockForm>>
            name="placement"
            label="Where it sits"
            maxLength={120}
          />
        </div>
        {warnings.length > 0 && (
          <>
            <CompatibilityWarnings warnings={warnings} />
            <CheckboxField<z.input<typeof addLivestockForm>>
              name="acknowledgeWarnings"
              label="I have read these warnings and add it anyway"
            />
          </>
        )}
        <FormProblem />
        <div className="flex flex-col-reverse gap-2 sm:flex-row sm:justify-end">
          <Button tone="secondary" onClick={() => onDone(null)}>
            Cancel
          </Button>
          <SubmitButton pending="Checking…" disabled={speciesId !== '' && check.isPending}>
            Add to the report
          </SubmitButton>
        </div>
      </Form>
    </SheetDialog>
  );
}

const pickForm = z.object({
  livestockId: z.string().min(1, 'choose the animal'),
  text: z.string().trim().max(500),
});

/** Which animal left the tank or moved, and why or where to. */
function PickLivestock({
  action,
  options,
  onDone,
}: {
  action: 'remove' | 'move';
  options: { value: string; label: string }[];
  onDone: (change: LivestockChange | null) => void;
}) {
  const form = useZodForm(
    pickForm.refine((v) => action === 'remove' || (v.text !== '' && v.text.length <= 120), {
      path: ['text'],
      message: 'say where it went (at most 120 characters)',
    }),
    { defaultValues: { livestockId: options[0]?.value ?? '', text: '' } },
  );
  return (
    <SheetDialog
      title={action === 'remove' ? 'Remove livestock' : 'Move livestock'}
      onClose={() => onDone(null)}
    >
      <Form
        form={form}
        className="grid gap-3"
        onSubmit={(values) =>
          onDone(
            action === 'remove'
              ? { action, livestockId: values.livestockId, ...(values.text ? { note: values.text } : {}) }
              : { action, livestockId: values.livestockId, placement: values.text },
          )
        }
      >
        <SelectField<z.input<typeof pickForm>>
          name="livestockId"
          label={action === 'remove' ? 'Which animal left the tank' : 'Which animal moved'}
          options={options}
        />
        <TextField<z.input<typeof pickForm>>
          name="text"
          label={action === 'remove' ? 'Why (optional)' : 'Where to'}
        />
        <FormProblem />
        <div className="flex flex-col-reverse gap-2 sm:flex-row sm:justify-end">
          <Button tone="secondary" onClick={() => onDone(null)}>
            Cancel
          </Button>
          <SubmitButton pending="Adding…">Add to the report</SubmitButton>
        </div>
      </Form>
    </SheetDialog>
  );
}

const addItemForm = z.object({
  priceItemId: z.string().min(1, 'choose an item from the price list'),
  quantity: decimalText(quantityUsed),
});
type AddItemValues = z.input<typeof addItemForm>;

/** Which consumable or part, and how many, in a sheet over the report. */
function AddItemUsed({
  options,
  onDone,
}: {
  options: { value: string; label: string }[];
  onDone: (item: { priceItemId: string; quantity: number } | null) => void;
}) {
  const form = useZodForm(addItemForm, { defaultValues: { priceItemId: '', quantity: '1' } });
  return (
    <SheetDialog title="Add a consumable or part" onClose={() => onDone(null)}>
      <Form form={form} className="grid gap-3" onSubmit={(values) => onDone(values)}>
        <SelectField<AddItemValues>
          name="priceItemId"
          label="Item from the price list"
          options={[{ value: '', label: 'Choose an item' }, ...options]}
        />
        <DecimalField<AddItemValues>
          name="quantity"
          label="Quantity"
          hint="Up to two decimals, such as 1.5 for one and a half bags."
          className="max-w-48"
        />
        <FormProblem />
        <div className="flex flex-col-reverse gap-2 sm:flex-row sm:justify-end">
          <Button tone="secondary" onClick={() => onDone(null)}>
            Cancel
          </Button>
          <SubmitButton pending="Adding…">Add to the report</SubmitButton>
        </div>
      </Form>
    </SheetDialog>
  );
}

/**
 * Consumables used and parts fitted, picked from the company's price list. The list is read once
 * and kept, so a report opened before the connection dropped can still add from it; without it the
 * items already chosen stay editable and a note says why nothing can be added.
 */
export function ItemsUsedSection() {
  const { fields, append, remove } = useFieldArray<ReportFormValues, 'itemsUsed'>({ name: 'itemsUsed' });
  const chosen = useWatch<ReportFormValues, 'itemsUsed'>({ name: 'itemsUsed' });
  const priceList = usePriceList();
  const online = useOnline();
  const [adding, setAdding] = useState(false);
  const items = priceList.data?.items ?? [];
  const byId = new Map(items.map((item) => [item.id, item]));
  const offered = items
    .filter(
      (item) => item.kind !== 'routine' && !item.archived && !chosen.some((c) => c.priceItemId === item.id),
    )
    .sort((a, b) => a.kind.localeCompare(b.kind) || a.name.localeCompare(b.name));

  let picker;
  if (priceList.data) {
    picker =
      offered.length === 0 ? (
        <p className="text-sm text-ink-700">
          {items.some((item) => item.kind !== 'routine' && !item.archived)
            ? 'Every consumable and part on the price list is on this report.'
            : 'The price list has no consumables or parts yet; an admin adds them under Price list.'}
        </p>
      ) : (
        <Button tone="secondary" onClick={() => setAdding(true)}>
          Add a consumable or part
        </Button>
      );
  } else if (!online || priceList.fetchStatus === 'paused') {
    picker = (
      <p className="rounded-lg bg-watch-100 p-3 text-sm font-bold text-watch-700">
        You are offline and this phone has not loaded the price list yet. Add consumables and parts once you
        are back online; the rest of the report is kept.
      </p>
    );
  } else if (priceList.isError) {
    picker = (
      <div className="flex flex-wrap items-center gap-2">
        <p className="text-sm font-bold text-alert-700">The price list could not be loaded.</p>
        <Button tone="secondary" onClick={() => void priceList.refetch()}>
          Try again
        </Button>
      </div>
    );
  } else {
    picker = <p className="text-sm text-ink-700">Loading the price list…</p>;
  }

  return (
    <SectionCard
      title="Consumables and parts used"
      hint="From the price list. Owners see what was used, without prices; the invoice is drafted from it."
    >
      {fields.length > 0 && (
        <ul className="grid gap-3">
          {fields.map((field, index) => {
            const item = byId.get(chosen[index]?.priceItemId ?? field.priceItemId);
            const name = item
              ? `${item.name}${item.archived ? ' (no longer on the price list)' : ''}`
              : priceList.data
                ? 'An item no longer on the price list'
                : 'An item from the price list';
            return (
              <li
                key={field.id}
                className="grid grid-cols-[minmax(0,1fr)_auto] items-end gap-2 rounded-lg border border-ink-100 p-3"
              >
                <DecimalField<ReportFormValues>
                  name={`itemsUsed.${index}.quantity`}
                  label={name}
                  hint={item ? priceItemKindLabels[item.kind] : undefined}
                  suffix={item?.unit}
                />
                <Button tone="secondary" className="mb-0.5" onClick={() => remove(index)}>
                  Remove<span className="sr-only"> {name}</span>
                </Button>
              </li>
            );
          })}
        </ul>
      )}
      {picker}
      {adding && (
        <AddItemUsed
          options={offered.map((item) => ({
            value: item.id,
            label: `${item.name} (${priceItemKindLabels[item.kind].toLowerCase()}, per ${item.unit})`,
          }))}
          onDone={(item) => {
            if (item) append({ priceItemId: item.priceItemId, quantity: decimalDefault(item.quantity) });
            setAdding(false);
          }}
        />
      )}
    </SectionCard>
  );
}

export function NotesSection() {
  const notes = useWatch<ReportFormValues, 'notes'>({ name: 'notes' });
  const [preview, setPreview] = useState(false);
  const previewId = useId();
  return (
    <SectionCard title="Notes for the owner" hint="Plain words; Markdown such as **bold** and lists is kept.">
      <TextAreaField<ReportFormValues> name="notes" label="Notes" rows={6} />
      <div>
        <Button
          tone="secondary"
          aria-expanded={preview}
          aria-controls={previewId}
          onClick={() => setPreview(!preview)}
        >
          {preview ? 'Hide preview' : 'Preview'}
        </Button>
        <div id={previewId} hidden={!preview} className="mt-2 rounded-lg border border-ink-100 bg-ink-50 p-3">
          {preview &&
            (notes.trim() === '' ? (
              <p className="text-sm text-ink-700">Nothing written yet.</p>
            ) : (
              <Markdown source={notes} />
            ))}
        </div>
      </div>
    </SectionCard>
  );
}

export function NextSection() {
  const { fields, append, remove } = useFieldArray<ReportFormValues, 'nextItems'>({ name: 'nextItems' });
  const {
    formState: { errors },
  } = useFormContext<ReportFormValues>();
  return (
    <SectionCard
      title="Next time"
      hint="Items stay on the tank’s checklist until a later visit ticks them off."
    >
      {fields.map((field, index) => (
        <div key={field.id} className="flex items-end gap-2">
          <TextField<ReportFormValues>
            name={`nextItems.${index}.text`}
            label={`Item ${index + 1}`}
            className="min-w-0 flex-1"
          />
          <Button tone="secondary" className="mb-0.5" onClick={() => remove(index)}>
            Remove
          </Button>
        </div>
      ))}
      <Button tone="secondary" onClick={() => append({ text: '' })}>
        Add an item for next time
      </Button>
      <fieldset className="grid gap-3 rounded-lg border border-ink-100 p-3">
        <legend className="px-1 font-bold text-ink-900">Next visit</legend>
        <p className="text-sm text-ink-700">Moves the tank’s next planned visit, or plans one with you.</p>
        <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
          <TextField<ReportFormValues>
            name="nextVisit.date"
            label="Date"
            type="date"
            className="col-span-2 sm:col-span-1"
          />
          <TextField<ReportFormValues> name="nextVisit.startTime" label="From" type="time" />
          <TextField<ReportFormValues> name="nextVisit.endTime" label="Until" type="time" />
        </div>
        {errors.nextVisit?.message && <FieldError>{errors.nextVisit.message}</FieldError>}
      </fieldset>
    </SectionCard>
  );
}
