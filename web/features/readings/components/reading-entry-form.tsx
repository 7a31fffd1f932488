import { useEffect, useId, useState } from 'react';
import { useFieldArray, useWatch } from 'react-hook-form';
import { z } from 'zod';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import { parameterKey, type ParameterKey } from '@shared/parameters/keys';
import { checkStoredValue, formatValue } from '@shared/parameters/units';
import { instrumentTempC } from '@shared/readings/entry';
import { manualSource, type ManualSource } from '@shared/readings/sources';
import { manualReadingInput, type ManualReadingInput } from '@shared/schemas/readings';
import { Button } from '../../../components/button';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { DecimalField, RadioGroupField, SelectField, TextField } from '../../../components/form-fields';
import { blankAsUndefined, decimalText } from '../../../lib/form-values';
import { instantFromLocalInput, localInputValue } from '../../../lib/format';
import { useCreateReadings } from '../api/create-readings';
import { preferredUnit, rememberUnit, unitOptions } from '../utils/display-units';

const temperature = decimalText(instrumentTempC.optional());

/**
 * One row as it stands: `null` when nothing was typed (not tested this time), else the reading to
 * send with the value Brinewatch will store, or problems under the row's fields.
 */
const entryRow = z
  .object({
    parameter: parameterKey,
    value: decimalText(z.number().optional()),
    unit: z.string(),
    sampleTempC: temperature,
    referenceTempC: temperature,
    /** Rows added by hand can be taken away again; the suggested ones stay. */
    added: z.boolean(),
  })
  .transform(({ parameter, value, unit, sampleTempC, referenceTempC }, context) => {
    if (value === undefined) return null;
    const specificGravity = unit === 'specific gravity';
    if (specificGravity && (sampleTempC === undefined || referenceTempC === undefined)) {
      for (const [field, given] of [
        ['sampleTempC', sampleTempC],
        ['referenceTempC', referenceTempC],
      ] as const) {
        if (given === undefined) {
          context.addIssue({
            code: 'custom',
            path: [field],
            message: 'enter the sample and reference temperatures in °C',
          });
        }
      }
      return z.NEVER;
    }
    const reading: Omit<ManualReadingInput, 'measuredAt'> = specificGravity
      ? { parameter, value, unit, sampleTempC, referenceTempC }
      : { parameter, value, unit };
    const stored = checkStoredValue(parameter, value, unit, reading);
    if (!stored.ok) {
      context.addIssue({ code: 'custom', path: [stored.field], message: stored.message });
      return z.NEVER;
    }
    return { reading, shown: formatValue(parameter, stored.value) };
  });
type EntryRow = z.input<typeof entryRow>;

const readingEntryForm = z
  .object({
    when: z.string().transform((text, context) => {
      const instant = instantFromLocalInput(text);
      if (instant) return instant;
      context.addIssue({ code: 'custom', message: 'Enter the date and time the water was tested.' });
      return z.NEVER;
    }),
    source: manualSource,
    rows: z.array(entryRow),
    /** The parameter chosen to add as another row; not part of the readings. */
    adding: z.union([z.literal(''), parameterKey]),
    method: blankAsUndefined(manualReadingInput.shape.method),
    note: blankAsUndefined(manualReadingInput.shape.note),
  })
  .transform(({ when, source, rows, method, note }) => ({
    source,
    readings: rows.flatMap((row) => (row ? [{ ...row.reading, measuredAt: when, method, note }] : [])),
  }));
type ReadingEntryValues = z.input<typeof readingEntryForm>;

const rowFields = ['value', 'unit', 'sampleTempC', 'referenceTempC'] as const;

/** A row as the form starts it: the unit as the kit last read it, instruments at 25 °C. */
const newRow = (parameter: ParameterKey, added = false): EntryRow => ({
  parameter,
  value: '',
  unit: preferredUnit(parameter),
  sampleTempC: '25',
  referenceTempC: '25',
  added,
});

interface ReadingEntryFormProps {
  tankId: string;
  /** Staff choose visit or home test; owners record home tests. */
  canRecordVisits: boolean;
  suggested: ParameterKey[];
  available: ParameterKey[];
  /** Parameters a device on the tank reports; a hand check of them is still welcome. */
  deviceReported?: ParameterKey[];
}

/**
 * A set of readings at once, as taken at the tank: big fields, the decimal keypad, the unit as
 * the kit reads it, and the value Brinewatch will store shown as you type.
 */
export function ReadingEntryForm({
  tankId,
  canRecordVisits,
  suggested,
  available,
  deviceReported = [],
}: ReadingEntryFormProps) {
  const formId = useId();
  // The picker offers nothing later than a few minutes from when the form opened (the server refuses later).
  const [latest] = useState(() => localInputValue(new Date(Date.now() + 5 * 60_000)));
  const create = useCreateReadings(tankId);
  const form = useZodForm(readingEntryForm, {
    mode: 'onChange',
    defaultValues: {
      when: localInputValue(new Date()),
      source: canRecordVisits ? 'visit' : 'home-test',
      rows: suggested.map((parameter) => newRow(parameter)),
      adding: '',
      method: '',
      note: '',
    },
  });
  const { fields, append, remove } = useFieldArray({ control: form.control, name: 'rows' });
  const rows = useWatch({ control: form.control, name: 'rows' });
  const adding = useWatch({ control: form.control, name: 'adding' });
  const { errors, isDirty, submitCount } = form.formState;

  // The unit a kit reads in is remembered for next time; a new unit re-checks the row's other fields.
  useEffect(() => {
    const { unsubscribe } = form.watch((values, { name, type }) => {
      const match = /^rows\.(\d+)\.unit$/.exec(name ?? '');
      const row = match ? values.rows?.[Number(match[1])] : undefined;
      if (type !== 'change' || !match || !row?.parameter || !row.unit) return;
      rememberUnit(row.parameter, row.unit);
      void form.trigger(`rows.${Number(match[1])}`);
    });
    return unsubscribe;
  }, [form]);

  const checks = rows.map((row) => entryRow.safeParse(row));
  const ready = checks.filter((check) => check.success && check.data !== null).length;
  const unused = available.filter((parameter) => !rows.some((row) => row.parameter === parameter));

  /** The API numbers only the readings sent, the rows with a value; its issues go to those rows. */
  const fieldFor = (path: string): string | null => {
    const match = /^readings\.(\d+)\.?(\w*)/.exec(path);
    if (!match) return path;
    const sent = form.getValues('rows').flatMap((row, index) => (row.value.trim() === '' ? [] : [index]));
    const index = sent[Number(match[1])];
    const field = match[2] ?? '';
    if (field === 'measuredAt') return 'when';
    if (field === 'method' || field === 'note') return field;
    if (index === undefined) return null;
    return `rows.${index}.${(rowFields as readonly string[]).includes(field) ? field : 'value'}`;
  };

  return (
    <Form
      form={form}
      fieldFor={fieldFor}
      aria-labelledby={`${formId}-title`}
      className="rounded-card bg-white p-4 shadow-card sm:p-6"
      onSubmit={async ({ source, readings }) => {
        if (readings.length === 0) {
          form.setError('root', { message: 'Enter at least one reading.' });
          return;
        }
        await create.mutateAsync({ readings, ...(canRecordVisits ? { source } : {}) });
        const values = form.getValues();
        form.reset({
          ...values,
          rows: values.rows.filter((row) => !row.added).map((row) => ({ ...row, value: '' })),
          adding: '',
          note: '',
        });
      }}
    >
      <h3 id={`${formId}-title`} className="text-xl font-bold text-ink-900">
        Add readings
      </h3>
      <p className="mt-1 text-sm text-ink-700">
        Fill in what you tested; empty rows are left out.{' '}
        {canRecordVisits ? '' : 'They are saved as home tests.'}
      </p>

      <div className="mt-4 grid gap-4 sm:grid-cols-2">
        <div className="flex min-w-0 flex-wrap items-end gap-2">
          <TextField<ReadingEntryValues>
            name="when"
            label="Tested at"
            type="datetime-local"
            max={latest}
            className="min-w-0 flex-1 basis-48"
          />
          <Button
            tone="secondary"
            onClick={() => form.setValue('when', localInputValue(new Date()), { shouldValidate: true })}
            className="min-h-12 shrink-0"
          >
            Now
          </Button>
        </div>
        {canRecordVisits && (
          <RadioGroupField<ReadingEntryValues, ManualSource>
            name="source"
            look="compact"
            label="Recorded as"
            options={[
              { value: 'visit', label: 'Visit' },
              { value: 'home-test', label: 'Home test' },
            ]}
          />
        )}
      </div>

      <ul className="mt-5 grid gap-3 md:grid-cols-2 xl:grid-cols-3">
        {fields.map((field, index) => {
          const row = rows[index] ?? field;
          const check = checks[index];
          const label = parameterCatalogue[field.parameter].label;
          const units = unitOptions(field.parameter, true);
          const marked = errors.rows?.[index] !== undefined;
          const alsoByDevice = deviceReported.includes(field.parameter);
          return (
            <li
              key={field.id}
              className="rounded-lg border border-ink-100 bg-sand-50 p-3"
              data-testid={`entry-${field.parameter}`}
            >
              <div className="grid grid-cols-[minmax(0,1fr)_auto] items-start gap-2">
                <DecimalField<ReadingEntryValues> name={`rows.${index}.value`} label={label} />
                {units.length > 1 ? (
                  <SelectField<ReadingEntryValues>
                    name={`rows.${index}.unit`}
                    label={<span className="sr-only">Unit for {label}</span>}
                    options={units}
                    className="mt-6 w-32"
                  />
                ) : (
                  <span className="mt-7 flex min-h-12 w-32 items-center justify-center rounded-lg border-2 border-ink-300 bg-ink-50 px-3 font-bold text-ink-700">
                    {units[0]?.label}
                  </span>
                )}
              </div>
              {alsoByDevice && (
                <p className="mt-1 text-sm text-ink-700">
                  Also reported by the probe: a hand check is welcome.
                </p>
              )}
              {row.unit === 'specific gravity' && (
                <div className="mt-2 grid grid-cols-2 gap-2">
                  <DecimalField<ReadingEntryValues>
                    name={`rows.${index}.sampleTempC`}
                    label="Water temperature when read, °C"
                  />
                  <DecimalField<ReadingEntryValues>
                    name={`rows.${index}.referenceTempC`}
                    label="Instrument reference, °C"
                  />
                  <p className="col-span-2 text-xs text-ink-700">
                    The reference is printed on the hydrometer or in the refractometer&apos;s manual (often 25
                    °C, some 20 °C or 4 °C). Converted with EOS-80 seawater density (UNESCO Technical Paper
                    44).
                  </p>
                </div>
              )}
              <p className="mt-2 min-h-5 text-sm" aria-live="polite">
                {marked || !check?.success ? null : check.data ? (
                  <span className="text-ink-800">
                    Saved as <strong>{check.data.shown}</strong>
                  </span>
                ) : (
                  <span className="text-ink-600">Not tested this time</span>
                )}
              </p>
              {field.added && (
                <button
                  type="button"
                  onClick={() => remove(index)}
                  className="min-h-11 rounded-lg px-3 text-sm font-bold text-ink-700 underline hover:text-ink-950"
                >
                  Remove<span className="sr-only"> {label}</span>
                </button>
              )}
            </li>
          );
        })}
      </ul>

      {unused.length > 0 && (
        <div className="mt-3 flex flex-wrap items-end gap-2">
          <SelectField<ReadingEntryValues>
            name="adding"
            label="Another parameter"
            className="min-w-48 flex-1"
            options={[
              { value: '', label: 'Choose…' },
              ...unused.map((parameter) => ({
                value: parameter,
                label: deviceReported.includes(parameter)
                  ? `${parameterCatalogue[parameter].label} (also reported by the probe)`
                  : parameterCatalogue[parameter].label,
              })),
            ]}
          />
          <Button
            tone="secondary"
            disabled={!adding}
            className="min-h-12"
            onClick={() => {
              if (!adding) return;
              append(newRow(adding, true));
              form.setValue('adding', '');
            }}
          >
            Add
          </Button>
        </div>
      )}

      <div className="mt-5 grid gap-4 sm:grid-cols-2">
        <TextField<ReadingEntryValues>
          name="method"
          label={
            <>
              Method <span className="font-normal text-ink-700">(optional)</span>
            </>
          }
          maxLength={80}
          placeholder="e.g. test kit, refractometer"
        />
        <TextField<ReadingEntryValues>
          name="note"
          label={
            <>
              Note <span className="font-normal text-ink-700">(optional)</span>
            </>
          }
          maxLength={1000}
        />
      </div>

      <div className="mt-5 flex flex-wrap items-center gap-3">
        <SubmitButton pending="Saving…" className="min-h-12 px-6 text-lg">
          {ready > 1 ? `Save ${ready} readings` : 'Save reading'}
        </SubmitButton>
        <FormProblem className="font-bold" />
        {submitCount > 0 && errors.rows && (
          <p role="alert" className="font-bold text-alert-700">
            Some readings need attention before saving.
          </p>
        )}
        {create.isSuccess && !isDirty && (
          <p role="status" className="font-bold text-healthy-700">
            ✓ Saved {create.data.readings.length} reading{create.data.readings.length === 1 ? '' : 's'}.
          </p>
        )}
      </div>
    </Form>
  );
}
