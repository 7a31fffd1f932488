import { useId, useState } from 'react';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import { parameterKeys, type ParameterKey } from '@shared/parameters/keys';
import {
  importColumns,
  readingsFromCsv,
  requiredColumns,
  type CsvImport as ParsedCsv,
} from '@shared/readings/csv';
import { maxImportRows } from '@shared/schemas/readings';
import type { ManualSource } from '@shared/readings/sources';
import { Button } from '../../../components/button';
import { ApiError } from '../../../lib/api-client';
import { useImportReadings } from '../api/import-readings';

const fieldNames: Record<string, string> = {
  measuredAt: 'measured_at',
  sampleTempC: 'sample_temp_c',
  referenceTempC: 'reference_temp_c',
};

/**
 * Import from our own plain CSV: the file is read and checked here first (the same schema the
 * API uses), the preview shows each row's problems by line, and nothing is saved unless every row
 * is fine — the import is all or nothing.
 */
export function CsvImport({ tankId, defaultSource }: { tankId: string; defaultSource: ManualSource }) {
  const inputId = useId();
  const [fileName, setFileName] = useState<string | null>(null);
  const [parsed, setParsed] = useState<ParsedCsv | null>(null);
  const [serverIssues, setServerIssues] = useState<Map<number, string[]>>(new Map());
  const importing = useImportReadings(tankId);

  const readFile = async (file: File | undefined) => {
    importing.reset();
    setServerIssues(new Map());
    if (!file) return setParsed(null);
    setFileName(file.name);
    setParsed(readingsFromCsv(await file.text(), defaultSource));
  };

  const rows = parsed?.rows ?? [];
  const bad = rows.filter((row) => row.issues.length > 0 || serverIssues.has(row.line)).length;
  const ready =
    parsed && parsed.problems.length === 0 && rows.length > 0 && bad === 0 && rows.length <= maxImportRows;

  const submit = () => {
    if (!ready) return;
    importing.mutate(
      { readings: rows.map((row) => row.reading!) },
      {
        onError: (error) => {
          if (!(error instanceof ApiError)) return;
          const byLine = new Map<number, string[]>();
          for (const issue of error.issues) {
            const match = /^body\.readings\.(\d+)\.?(\w*)/.exec(issue.path);
            const row = match ? rows[Number(match[1])] : undefined;
            if (!row) continue;
            const column = match![2] ? (fieldNames[match![2]] ?? match![2]) : '';
            byLine.set(row.line, [
              ...(byLine.get(row.line) ?? []),
              column ? `${column}: ${issue.message}` : issue.message,
            ]);
          }
          setServerIssues(byLine);
        },
      },
    );
  };

  return (
    <section aria-labelledby={`${inputId}-title`} className="rounded-lg border border-ink-100 bg-sand-50 p-4">
      <h4 id={`${inputId}-title`} className="font-bold text-ink-900">
        Import readings from a CSV file
      </h4>
      <details className="mt-1 text-sm text-ink-700">
        <summary className="cursor-pointer font-bold text-ink-800">What the file looks like</summary>
        <p className="mt-2">
          A header line, then one reading per line. Columns <code>{requiredColumns.join(', ')}</code> are
          needed; <code>{importColumns.filter((c) => !requiredColumns.includes(c)).join(', ')}</code> are
          optional. Times are ISO 8601 with their offset (<code>2026-11-30T18:45:00+00:00</code>);{' '}
          <code>source</code> is <code>home-test</code> or <code>visit</code>. A file downloaded above imports
          as it is.
        </p>
        <p className="mt-1">
          Parameters:{' '}
          {parameterKeys.map((key: ParameterKey) => (
            <code key={key} className="mr-1">
              {key}
            </code>
          ))}
        </p>
      </details>
      <label htmlFor={inputId} className="mt-3 block text-sm font-bold text-ink-900">
        CSV file
      </label>
      <input
        id={inputId}
        type="file"
        accept=".csv,text/csv"
        onChange={(event) => void readFile(event.target.files?.[0])}
        className="mt-1 block min-h-11 w-full text-sm file:mr-3 file:min-h-11 file:rounded-lg file:border-0 file:bg-ink-800 file:px-4 file:font-bold file:text-white"
      />

      {parsed && (
        <div className="mt-4 space-y-3" aria-live="polite">
          {parsed.problems.map((problem) => (
            <p key={problem} role="alert" className="font-bold text-alert-700">
              {fileName}: {problem}.
            </p>
          ))}
          {parsed.ignoredColumns.length > 0 && (
            <p className="text-sm text-ink-700">Columns not imported: {parsed.ignoredColumns.join(', ')}.</p>
          )}
          {rows.length > 0 && (
            <>
              <p className="font-bold text-ink-900">
                {rows.length} reading{rows.length === 1 ? '' : 's'} read
                {bad > 0
                  ? `; ${bad} need${bad === 1 ? 's' : ''} fixing before anything is imported.`
                  : ', all ready to import.'}
                {rows.length > maxImportRows && ` At most ${maxImportRows} at a time: split the file.`}
              </p>
              <div className="max-h-80 overflow-auto rounded-lg border border-ink-100 bg-white">
                <table className="w-full border-collapse text-left text-sm">
                  <caption className="sr-only">Preview of the file</caption>
                  <thead className="sticky top-0 bg-ink-50">
                    <tr>
                      <th scope="col" className="px-3 py-2">
                        Line
                      </th>
                      <th scope="col" className="px-3 py-2">
                        Reading
                      </th>
                      <th scope="col" className="px-3 py-2">
                        Check
                      </th>
                    </tr>
                  </thead>
                  <tbody>
                    {rows.map((row) => {
                      const issues = [
                        ...row.issues.map((i) => (i.column ? `${i.column}: ${i.message}` : i.message)),
                        ...(serverIssues.get(row.line) ?? []),
                      ];
                      const name =
                        parameterCatalogue[row.cells.parameter as ParameterKey]?.label ?? row.cells.parameter;
                      return (
                        <tr key={row.line} className="border-t border-ink-100 align-top">
                          <td className="px-3 py-2">{row.line}</td>
                          <td className="px-3 py-2">
                            {name} {row.cells.value} {row.cells.unit}
                            <span className="block text-xs text-ink-700">
                              {row.cells.measured_at} · {row.cells.source || defaultSource}
                            </span>
                          </td>
                          <td className="px-3 py-2">
                            {issues.length === 0 ? (
                              <span className="font-bold text-healthy-700">✓ ready</span>
                            ) : (
                              <ul className="list-none space-y-1 font-bold text-alert-700">
                                {issues.map((issue) => (
                                  <li key={issue}>
                                    <span aria-hidden="true">! </span>
                                    {issue}
                                  </li>
                                ))}
                              </ul>
                            )}
                          </td>
                        </tr>
                      );
                    })}
                  </tbody>
                </table>
              </div>
              <Button onClick={submit} disabled={!ready || importing.isPending || importing.isSuccess}>
                {importing.isPending
                  ? 'Importing…'
                  : `Import ${rows.length} reading${rows.length === 1 ? '' : 's'}`}
              </Button>
              {importing.isSuccess && (
                <p role="status" className="font-bold text-healthy-700">
                  ✓ Imported {importing.data.imported} readings.
                </p>
              )}
              {importing.isError && (
                <p role="alert" className="font-bold text-alert-700">
                  Nothing was imported: {importing.error.message}
                </p>
              )}
            </>
          )}
        </div>
      )}
    </section>
  );
}
