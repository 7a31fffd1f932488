import { useWatch } from 'react-hook-form';
import { z } from 'zod';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import { parameterKey, type ParameterKey } from '@shared/parameters/keys';
import { unitSymbol } from '@shared/parameters/units';
import { readingSourceLabels } from '@shared/readings/source-labels';
import { readingSource, readingSources } from '@shared/readings/sources';
import { Button } from '../../../components/button';
import { Form, useZodForm } from '../../../components/form';
import { SelectField, TextField } from '../../../components/form-fields';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { exportReadingsUrl } from '../api/export-readings';
import { useListReadings, type ReadingFilters } from '../api/list-readings';
import { formatIn, storedUnit } from '../utils/display-units';
import { formatDateTime } from '../../../lib/format';
import { CsvImport } from './csv-import';

interface ReadingsTableProps {
  tankId: string;
  parameters: ParameterKey[];
  initialParameter: ParameterKey;
  canImport: boolean;
  defaultImportSource: 'visit' | 'home-test';
}

/** Day boundaries of the date filters, in the person's own time zone. */
const dayStart = (day: string) => (day ? new Date(`${day}T00:00:00`).toISOString() : undefined);
const dayEnd = (day: string) => (day ? new Date(`${day}T23:59:59.999`).toISOString() : undefined);

/** The filters as chosen; "" is "all" (or no bound), and each choice applies as it is made. */
const readingFilters = z.object({
  parameter: z.union([z.literal(''), parameterKey]),
  source: z.union([z.literal(''), readingSource]),
  fromDay: z.string(),
  toDay: z.string(),
});
type ReadingFilterValues = z.infer<typeof readingFilters>;

export function ReadingsTable({
  tankId,
  parameters,
  initialParameter,
  canImport,
  defaultImportSource,
}: ReadingsTableProps) {
  const form = useZodForm(readingFilters, {
    defaultValues: { parameter: initialParameter, source: '', fromDay: '', toDay: '' },
  });
  const [parameter, source, fromDay, toDay] = useWatch({
    control: form.control,
    name: ['parameter', 'source', 'fromDay', 'toDay'],
  });
  const filters: ReadingFilters = {
    parameter: parameter || undefined,
    source: source || undefined,
    from: dayStart(fromDay),
    to: dayEnd(toDay),
  };
  const list = useListReadings(tankId, filters);
  const rows = list.data?.pages.flatMap((page) => page.readings) ?? [];

  return (
    <div className="space-y-4">
      <Form
        form={form}
        // Each filter applies as it is chosen; there is nothing to send.
        onSubmit={() => undefined}
        className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4"
        aria-label="Filter readings"
      >
        <SelectField<ReadingFilterValues>
          name="parameter"
          label="Parameter"
          options={[
            { value: '', label: 'All parameters' },
            ...parameters.map((key) => ({ value: key, label: parameterCatalogue[key].label })),
          ]}
        />
        <SelectField<ReadingFilterValues>
          name="source"
          label="Source"
          options={[
            { value: '', label: 'All sources' },
            ...readingSources.map((key) => ({ value: key, label: readingSourceLabels[key] })),
          ]}
        />
        <TextField<ReadingFilterValues> name="fromDay" label="From" type="date" />
        <TextField<ReadingFilterValues> name="toDay" label="To" type="date" />
      </Form>

      <div className="flex flex-wrap gap-2">
        <a
          href={exportReadingsUrl(tankId, filters)}
          download
          className="inline-flex min-h-11 items-center rounded-lg border border-ink-300 bg-white px-4 font-bold text-ink-900 no-underline hover:bg-ink-50"
        >
          Download these readings (CSV)
        </a>
      </div>

      {list.isPending ? (
        <LoadingState label="Loading readings…" />
      ) : list.isError ? (
        <ErrorState error={list.error} what="the readings" onRetry={() => void list.refetch()} />
      ) : rows.length === 0 ? (
        <EmptyState title="No readings match">Change the filters to see more.</EmptyState>
      ) : (
        <>
          {/* On a phone each reading is a card, so its value is never cut off by a too-wide table. */}
          <ol aria-label="Readings, newest first" className="space-y-2 md:hidden">
            {rows.map((r) => {
              const converted = r.enteredUnit !== storedUnit(r.parameter);
              const notes = [r.method, r.note].filter(Boolean).join(' · ');
              return (
                <li key={r.id} className="rounded-lg border border-ink-100 bg-white p-3 text-sm">
                  <div className="flex flex-wrap items-baseline justify-between gap-x-3">
                    <span className="font-bold text-ink-900">{parameterCatalogue[r.parameter].label}</span>
                    <span className="text-base font-bold text-ink-950">
                      {formatIn(r.parameter, r.value, storedUnit(r.parameter))}
                    </span>
                  </div>
                  {converted && (
                    <p className="text-xs text-ink-700">
                      entered {r.enteredValue} {unitSymbol(r.parameter, r.enteredUnit)}
                      {r.sampleTempC !== null && r.referenceTempC !== null
                        ? ` at ${r.sampleTempC} °C (ref. ${r.referenceTempC} °C)`
                        : ''}
                    </p>
                  )}
                  <p className="mt-1 text-ink-700">
                    <time dateTime={r.measuredAt}>{formatDateTime(r.measuredAt)}</time> ·{' '}
                    {readingSourceLabels[r.source]}
                    {r.recordedBy && <> · {r.recordedBy}</>}
                  </p>
                  {notes && <p className="mt-1 break-words text-ink-800">{notes}</p>}
                </li>
              );
            })}
          </ol>
          <div className="hidden overflow-x-auto rounded-lg border border-ink-100 md:block">
            <table className="w-full border-collapse text-left text-sm">
              <caption className="sr-only">Readings, newest first</caption>
              <thead className="bg-ink-50 text-ink-900">
                <tr>
                  <th scope="col" className="px-3 py-2">
                    When
                  </th>
                  <th scope="col" className="px-3 py-2">
                    Parameter
                  </th>
                  <th scope="col" className="px-3 py-2">
                    Value
                  </th>
                  <th scope="col" className="px-3 py-2">
                    Source
                  </th>
                  <th scope="col" className="px-3 py-2">
                    Notes
                  </th>
                </tr>
              </thead>
              <tbody>
                {rows.map((r) => {
                  const converted = r.enteredUnit !== storedUnit(r.parameter);
                  return (
                    <tr key={r.id} className="border-t border-ink-100 align-top">
                      <td className="whitespace-nowrap px-3 py-2">
                        <time dateTime={r.measuredAt}>{formatDateTime(r.measuredAt)}</time>
                      </td>
                      <td className="px-3 py-2">{parameterCatalogue[r.parameter].label}</td>
                      <td className="whitespace-nowrap px-3 py-2 font-bold">
                        {formatIn(r.parameter, r.value, storedUnit(r.parameter))}
                        {converted && (
                          <span className="block text-xs font-normal text-ink-700">
                            entered {r.enteredValue} {unitSymbol(r.parameter, r.enteredUnit)}
                            {r.sampleTempC !== null && r.referenceTempC !== null
                              ? ` at ${r.sampleTempC} °C (ref. ${r.referenceTempC} °C)`
                              : ''}
                          </span>
                        )}
                      </td>
                      <td className="px-3 py-2">
                        {readingSourceLabels[r.source]}
                        {r.recordedBy && <span className="block text-xs text-ink-700">{r.recordedBy}</span>}
                      </td>
                      <td className="px-3 py-2 text-ink-800">
                        {[r.method, r.note].filter(Boolean).join(' · ')}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
        </>
      )}
      {list.hasNextPage && (
        <Button tone="secondary" onClick={() => void list.fetchNextPage()} disabled={list.isFetchingNextPage}>
          {list.isFetchingNextPage ? 'Loading…' : 'Show older readings'}
        </Button>
      )}

      {canImport && <CsvImport tankId={tankId} defaultSource={defaultImportSource} />}
    </div>
  );
}
