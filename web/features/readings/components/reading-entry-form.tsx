import { useId, useState, type FormEvent } from 'react';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import { checkStoredValue, formatValue } from '@shared/parameters/units';
import { manualReadingInput, type ManualReadingInput } from '@shared/schemas/readings';
import type { ManualSource } from '@shared/readings/sources';
import { Button } from '../../../components/button';
import { ApiError } from '../../../lib/api-client';
import { parseDecimal } from '../../../lib/decimal';
import { useCreateReadings } from '../api/create-readings';
import { preferredUnit, rememberUnit, unitOptions } from '../utils/display-units';
import { instantFromLocalInput, localInputValue } from '../../../lib/format';
import { RadioGroup } from '../../../components/radio-group';

interface Row {
  key: number;
  parameter: ParameterKey;
  value: string;
  unit: string;
  sampleTempC: string;
  referenceTempC: string;
  /** Rows added by hand can be taken away again; the suggested ones stay. */
  added: boolean;
}

type RowCheck =
  | { state: 'empty' }
  | { state: 'error'; message: string; field: string }
  | { state: 'ok'; reading: Omit<ManualReadingInput, 'measuredAt'>; shown: string };

const fieldClass =
  'min-h-12 w-full min-w-0 rounded-lg border-2 bg-white px-3 text-lg text-ink-950 focus:border-ink-700';

/** Reads one row as it stands: nothing yet, a problem to show beside it, or a reading ready to send. */
function checkRow(row: Row): RowCheck {
  const value = parseDecimal(row.value);
  if (value.state === 'empty') return { state: 'empty' };
  if (value.state === 'invalid') return { state: 'error', message: value.reason, field: 'value' };
  const reading: Omit<ManualReadingInput, 'measuredAt'> = {
    parameter: row.parameter,
    value: value.value,
    unit: row.unit,
  };
  if (row.unit === 'specific gravity') {
    for (const [field, text] of [
      ['sampleTempC', row.sampleTempC],
      ['referenceTempC', row.referenceTempC],
    ] as const) {
      const temperature = parseDecimal(text);
      if (temperature.state !== 'number') {
        return { state: 'error', message: 'enter the sample and reference temperatures in °C', field };
      }
      reading[field] = temperature.value;
    }
  }
  const stored = checkStoredValue(row.parameter, value.value, row.unit, reading);
  if (!stored.ok) return { state: 'error', message: stored.message, field: stored.field };
  return { state: 'ok', reading, shown: formatValue(row.parameter, stored.value) };
}

interface ReadingEntryFormProps {
  tankId: string;
  /** Staff choose visit or home test; owners record home tests. */
  canRecordVisits: boolean;
  suggested: ParameterKey[];
  available: ParameterKey[];
}

let nextKey = 1;
const newRow = (parameter: ParameterKey, added = false): Row => ({
  key: nextKey++,
  parameter,
  value: '',
  unit: preferredUnit(parameter),
  sampleTempC: '25',
  referenceTempC: '25',
  added,
});

/**
 * A set of readings at once, as taken at the tank: big fields, the decimal keypad, the unit as
 * the kit reads it, and the value Brinewatch will store shown as you type.
 */
export function ReadingEntryForm({ tankId, canRecordVisits, suggested, available }: ReadingEntryFormProps) {
  const formId = useId();
  const [rows, setRows] = useState<Row[]>(() => suggested.map((parameter) => newRow(parameter)));
  const [when, setWhen] = useState(() => localInputValue(new Date()));
  // The picker offers nothing later than a few minutes from when the form opened (the server refuses later).
  const [latest] = useState(() => localInputValue(new Date(Date.now() + 5 * 60_000)));
  const [source, setSource] = useState<ManualSource>(canRecordVisits ? 'visit' : 'home-test');
  const [method, setMethod] = useState('');
  const [note, setNote] = useState('');
  const [adding, setAdding] = useState<ParameterKey | ''>('');
  const [serverIssues, setServerIssues] = useState<Map<number, string>>(new Map());
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState<number | null>(null);
  const create = useCreateReadings(tankId);

  const update = (key: number, change: Partial<Row>) => {
    setSaved(null);
    setServerIssues((issues) => {
      if (!issues.has(key)) return issues;
      const next = new Map(issues);
      next.delete(key);
      return next;
    });
    setRows((current) => current.map((row) => (row.key === key ? { ...row, ...change } : row)));
  };

  const checks = new Map(rows.map((row) => [row.key, checkRow(row)]));
  const ready = rows.filter((row) => checks.get(row.key)?.state === 'ok');
  const withErrors = rows.filter((row) => checks.get(row.key)?.state === 'error');
  const unused = available.filter((parameter) => !rows.some((row) => row.parameter === parameter));

  const submit = (event: FormEvent) => {
    event.preventDefault();
    setFormError(null);
    setSaved(null);
    const measuredAt = instantFromLocalInput(when);
    if (!measuredAt) return setFormError('Enter the date and time the water was tested.');
    if (withErrors.length > 0) return setFormError('Some readings need attention before saving.');
    if (ready.length === 0) return setFormError('Enter at least one reading.');
    const readings = ready.map((row) => {
      const check = checks.get(row.key) as Extract<RowCheck, { state: 'ok' }>;
      return manualReadingInput.parse({
        ...check.reading,
        measuredAt,
        ...(method.trim() ? { method: method.trim() } : {}),
        ...(note.trim() ? { note: note.trim() } : {}),
      });
    });
    create.mutate(
      { readings, ...(canRecordVisits ? { source } : {}) },
      {
        onSuccess: (result) => {
          setSaved(result.readings.length);
          setRows((current) => current.filter((row) => !row.added).map((row) => ({ ...row, value: '' })));
          setNote('');
        },
        onError: (error) => {
          if (!(error instanceof ApiError))
            return setFormError('The readings could not be saved. Please try again.');
          const byRow = new Map<number, string>();
          const general: string[] = [];
          for (const issue of error.issues) {
            const match = /^body\.readings\.(\d+)\.(\w+)/.exec(issue.path);
            const row = match ? ready[Number(match[1])] : undefined;
            if (row) byRow.set(row.key, issue.message);
            else general.push(issue.message);
          }
          setServerIssues(byRow);
          setFormError(
            byRow.size > 0
              ? 'Nothing was saved: fix the readings marked below.'
              : `Nothing was saved: ${general.join('; ') || error.message}`,
          );
        },
      },
    );
  };

  return (
    <form
      onSubmit={submit}
      noValidate
      aria-labelledby={`${formId}-title`}
      className="rounded-card bg-white p-4 shadow-card sm:p-6"
    >
      <h3 id={`${formId}-title`} className="text-xl font-bold text-ink-900">
        Add readings
      </h3>
      <p className="mt-1 text-sm text-ink-700">
        Fill in what you tested; empty rows are left out.{' '}
        {canRecordVisits ? '' : 'They are saved as home tests.'}
      </p>

      <div className="mt-4 grid gap-4 sm:grid-cols-2">
        <div>
          <label htmlFor={`${formId}-when`} className="mb-1 block font-bold text-ink-900">
            Tested at
          </label>
          <div className="flex gap-2">
            <input
              id={`${formId}-when`}
              type="datetime-local"
              value={when}
              max={latest}
              onChange={(event) => setWhen(event.target.value)}
              className={`${fieldClass} border-ink-300`}
            />
            <Button
              tone="secondary"
              onClick={() => setWhen(localInputValue(new Date()))}
              className="min-h-12 shrink-0"
            >
              Now
            </Button>
          </div>
        </div>
        {canRecordVisits && (
          <RadioGroup
            look="compact"
            legend="Recorded as"
            value={source}
            onChange={setSource}
            options={[
              { value: 'visit', label: 'Visit' },
              { value: 'home-test', label: 'Home test' },
            ]}
          />
        )}
      </div>

      <ul className="mt-5 grid gap-3 md:grid-cols-2 xl:grid-cols-3">
        {rows.map((row) => {
          const check = checks.get(row.key)!;
          const label = parameterCatalogue[row.parameter].label;
          const valueId = `${formId}-${row.key}-value`;
          const unitId = `${formId}-${row.key}-unit`;
          const messageId = `${formId}-${row.key}-message`;
          const problem = serverIssues.get(row.key) ?? (check.state === 'error' ? check.message : null);
          const units = unitOptions(row.parameter, true);
          return (
            <li
              key={row.key}
              className="rounded-lg border border-ink-100 bg-sand-50 p-3"
              data-testid={`entry-${row.parameter}`}
            >
              <div className="flex items-center justify-between gap-2">
                <label htmlFor={valueId} className="font-bold text-ink-900">
                  {label}
                </label>
                {row.added && (
                  <button
                    type="button"
                    onClick={() => setRows((current) => current.filter((r) => r.key !== row.key))}
                    className="min-h-11 rounded-lg px-3 text-sm font-bold text-ink-700 underline hover:text-ink-950"
                  >
                    Remove<span className="sr-only"> {label}</span>
                  </button>
                )}
              </div>
              <div className="mt-2 grid grid-cols-[minmax(0,1fr)_auto] gap-2">
                <input
                  id={valueId}
                  type="text"
                  inputMode="decimal"
                  autoComplete="off"
                  spellCheck={false}
                  value={row.value}
                  onChange={(event) => update(row.key, { value: event.target.value })}
                  aria-invalid={problem ? true : undefined}
                  aria-describedby={messageId}
                  className={`${fieldClass} ${problem ? 'border-alert-700' : 'border-ink-300'}`}
                />
                {units.length > 1 ? (
                  <>
                    <label htmlFor={unitId} className="sr-only">
                      Unit for {label}
                    </label>
                    <select
                      id={unitId}
                      value={row.unit}
                      onChange={(event) => {
                        rememberUnit(row.parameter, event.target.value);
                        update(row.key, { unit: event.target.value });
                      }}
                      className="min-h-12 w-32 rounded-lg border-2 border-ink-300 bg-white px-2 text-base font-bold text-ink-900 focus:border-ink-700"
                    >
                      {units.map((option) => (
                        <option key={option.value} value={option.value}>
                          {option.label}
                        </option>
                      ))}
                    </select>
                  </>
                ) : (
                  <span className="flex min-h-12 w-32 items-center justify-center rounded-lg border-2 border-ink-300 bg-ink-50 px-3 font-bold text-ink-700">
                    {units[0]?.label}
                  </span>
                )}
              </div>
              {row.unit === 'specific gravity' && (
                <div className="mt-2 grid grid-cols-2 gap-2">
                  {(
                    [
                      ['sampleTempC', 'Water temperature when read, °C'],
                      ['referenceTempC', 'Instrument reference, °C'],
                    ] as const
                  ).map(([field, text]) => (
                    <div key={field}>
                      <label htmlFor={`${valueId}-${field}`} className="block text-sm font-bold text-ink-900">
                        {text}
                      </label>
                      <input
                        id={`${valueId}-${field}`}
                        type="text"
                        inputMode="decimal"
                        autoComplete="off"
                        value={row[field]}
                        onChange={(event) => update(row.key, { [field]: event.target.value })}
                        className={`${fieldClass} mt-1 border-ink-300`}
                      />
                    </div>
                  ))}
                  <p className="col-span-2 text-xs text-ink-700">
                    The reference is printed on the hydrometer or in the refractometer&apos;s manual (often 25
                    °C, some 20 °C or 4 °C). Converted with EOS-80 seawater density (UNESCO Technical Paper
                    44).
                  </p>
                </div>
              )}
              <p id={messageId} className="mt-2 min-h-5 text-sm" aria-live="polite">
                {problem ? (
                  <span className="flex items-start gap-1.5 font-bold text-alert-700">
                    <span aria-hidden="true">!</span>
                    {problem}
                  </span>
                ) : check.state === 'ok' ? (
                  <span className="text-ink-800">
                    Saved as <strong>{check.shown}</strong>
                  </span>
                ) : (
                  <span className="text-ink-600">Not tested this time</span>
                )}
              </p>
            </li>
          );
        })}
      </ul>

      {unused.length > 0 && (
        <div className="mt-3 flex flex-wrap items-end gap-2">
          <div className="min-w-48 flex-1">
            <label htmlFor={`${formId}-add`} className="mb-1 block text-sm font-bold text-ink-900">
              Another parameter
            </label>
            <select
              id={`${formId}-add`}
              value={adding}
              onChange={(event) => setAdding(event.target.value as ParameterKey | '')}
              className="min-h-11 w-full rounded-lg border-2 border-ink-300 bg-white px-3 text-base focus:border-ink-700"
            >
              <option value="">Choose…</option>
              {unused.map((parameter) => (
                <option key={parameter} value={parameter}>
                  {parameterCatalogue[parameter].label}
                </option>
              ))}
            </select>
          </div>
          <Button
            tone="secondary"
            disabled={!adding}
            onClick={() => {
              if (!adding) return;
              setRows((current) => [...current, newRow(adding, true)]);
              setAdding('');
            }}
          >
            Add
          </Button>
        </div>
      )}

      <div className="mt-5 grid gap-4 sm:grid-cols-2">
        <div>
          <label htmlFor={`${formId}-method`} className="mb-1 block font-bold text-ink-900">
            Method <span className="font-normal text-ink-700">(optional)</span>
          </label>
          <input
            id={`${formId}-method`}
            value={method}
            maxLength={80}
            onChange={(event) => setMethod(event.target.value)}
            placeholder="e.g. test kit, refractometer"
            className={`${fieldClass} border-ink-300 text-base`}
          />
        </div>
        <div>
          <label htmlFor={`${formId}-note`} className="mb-1 block font-bold text-ink-900">
            Note <span className="font-normal text-ink-700">(optional)</span>
          </label>
          <input
            id={`${formId}-note`}
            value={note}
            maxLength={1000}
            onChange={(event) => setNote(event.target.value)}
            className={`${fieldClass} border-ink-300 text-base`}
          />
        </div>
      </div>

      <div className="mt-5 flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={create.isPending} className="min-h-12 px-6 text-lg">
          {create.isPending ? 'Saving…' : ready.length > 1 ? `Save ${ready.length} readings` : 'Save reading'}
        </Button>
        {formError && (
          <p role="alert" className="font-bold text-alert-700">
            {formError}
          </p>
        )}
        {saved !== null && (
          <p role="status" className="font-bold text-healthy-700">
            ✓ Saved {saved} reading{saved === 1 ? '' : 's'}.
          </p>
        )}
      </div>
    </form>
  );
}
