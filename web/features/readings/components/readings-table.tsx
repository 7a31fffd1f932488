import { useState } from 'react';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import { unitSymbol } from '@shared/parameters/units';
import { readingSourceLabels, readingSources, type ReadingSource } from '@shared/readings/sources';
import { Button } from '../../../components/button';
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

const fieldClass =
  'min-h-11 w-full rounded-lg border-2 border-ink-300 bg-white px-3 text-base text-ink-950 focus:border-ink-700';

/** Day boundaries of the date filters, in the person's own time zone. */
const dayStart = (day: string) => (day ? new Date(`${day}T00:00:00`).toISOString() : undefined);
const dayEnd = (day: string) => (day ? new Date(`${day}T23:59:59.999`).toISOString() : undefined);

export function ReadingsTable({
  tankId,
  parameters,
  initialParameter,
  canImport,
  defaultImportSource,
}: ReadingsTableProps) {
  const [parameter, setParameter] = useState<ParameterKey | ''>(initialParameter);
  const [source, setSource] = useState<ReadingSource | ''>('');
  const [fromDay, setFromDay] = useState('');
  const [toDay, setToDay] = useState('');
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
      <form
        className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4"
        onSubmit={(event) => event.preventDefault()}
        aria-label="Filter readings"
      >
        <div>
          <label htmlFor="table-parameter" className="mb-1 block text-sm font-bold text-ink-900">
            Parameter
          </label>
          <select
            id="table-parameter"
            value={parameter}
            onChange={(e) => setParameter(e.target.value as ParameterKey | '')}
            className={fieldClass}
          >
            <option value="">All parameters</option>
            {parameters.map((key) => (
              <option key={key} value={key}>
                {parameterCatalogue[key].label}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="table-source" className="mb-1 block text-sm font-bold text-ink-900">
            Source
          </label>
          <select
            id="table-source"
            value={source}
            onChange={(e) => setSource(e.target.value as ReadingSource | '')}
            className={fieldClass}
          >
            <option value="">All sources</option>
            {readingSources.map((key) => (
              <option key={key} value={key}>
                {readingSourceLabels[key]}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="table-from" className="mb-1 block text-sm font-bold text-ink-900">
            From
          </label>
          <input
            id="table-from"
            type="date"
            value={fromDay}
            onChange={(e) => setFromDay(e.target.value)}
            className={fieldClass}
          />
        </div>
        <div>
          <label htmlFor="table-to" className="mb-1 block text-sm font-bold text-ink-900">
            To
          </label>
          <input
            id="table-to"
            type="date"
            value={toDay}
            onChange={(e) => setToDay(e.target.value)}
            className={fieldClass}
          />
        </div>
      </form>

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
        <div className="overflow-x-auto rounded-lg border border-ink-100">
          <table className="w-full min-w-[36rem] border-collapse text-left text-sm">
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
