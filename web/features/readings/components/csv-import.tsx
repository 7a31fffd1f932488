import { useId, useState } from 'react';
import type { FieldError, FieldErrors } from 'react-hook-form';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import { parameterKeys, type ParameterKey } from '@shared/parameters/keys';
import {
  importColumns,
  readingsFromCsv,
  requiredColumns,
  type CsvImport as ParsedCsv,
} from '@shared/readings/csv';
import type { ImportedReadingInput } from '@shared/readings/entry';
import { importReadingsInput, maxImportRows } from '@shared/schemas/readings';
import type { ManualSource } from '@shared/readings/sources';
import { Form, SubmitButton, useZodForm } from '../../../components/form';
import { useImportReadings } from '../api/import-readings';

const fieldNames: Record<string, string> = {
  measuredAt: 'measured_at',
  sampleTempC: 'sample_temp_c',
  referenceTempC: 'reference_temp_c',
};

/** The API's problems with one sent row, as "column: message" lines. */
function rowProblems(errors: FieldErrors<ImportedReadingInput> | FieldError | undefined): string[] {
  if (!errors) return [];
  if ('message' in errors && typeof errors.message === 'string') return [errors.message];
  return Object.entries(errors as FieldErrors<ImportedReadingInput>).flatMap(([field, error]) =>
    error?.message ? [`${fieldNames[field] ?? field}: ${String(error.message)}`] : [],
  );
}

/**
 * Import from our own plain CSV: the file is read and checked here first (the same schema the
 * API uses), the preview shows each row's problems by line, and nothing is saved unless every row
 * is fine — the import is all or nothing.
 */
export function CsvImport({ tankId, defaultSource }: { tankId: string; defaultSource: ManualSource }) {
  const inputId = useId();
  const [file, setFile] = useState<{ name: string; csv: ParsedCsv } | null>(null);
  const importing = useImportReadings(tankId);
  // The form holds exactly the request, so the API's issues land on their rows by path.
  const form = useZodForm(importReadingsInput, { defaultValues: { readings: [] } });
  const sentErrors = form.formState.errors.readings;

  const readFile = async (chosen: File | undefined) => {
    importing.reset();
    if (!chosen) {
      setFile(null);
      form.reset({ readings: [] });
      return;
    }
    const csv = readingsFromCsv(await chosen.text(), defaultSource);
    setFile({ name: chosen.name, csv });
    form.reset({ readings: csv.rows.flatMap((row) => (row.reading ? [row.reading] : [])) });
  };

  const parsed = file?.csv ?? null;
  const fileName = file?.name ?? null;
  const rows = parsed?.rows ?? [];
  const serverProblems = rows.map((_, index) => rowProblems(sentErrors?.[index]));
  const bad = rows.filter((row, index) => row.issues.length > 0 || serverProblems[index]!.length > 0).length;
  const ready =
    parsed !== null &&
    parsed.problems.length === 0 &&
    rows.length > 0 &&
    bad === 0 &&
    rows.length <= maxImportRows;

  return (
    <section aria-labelledby={`${inputId}-title`} className="rounded-lg border border-ink-100 bg-sand-50 p-4">
      <Form form={form} onSubmit={(input) => importing.mutateAsync(input)}>
        <h4 id={`${inputId}-title`} className="font-bold text-ink-900">
          Import readings from a CSV file
        </h4>
        <details className="mt-1 text-sm break-words text-ink-700">
          <summary className="cursor-pointer font-bold text-ink-800">What the file looks like</summary>
          <p className="mt-2">
            A header line, then one reading per line. Columns <code>{requiredColumns.join(', ')}</code> are
            needed; <code>{importColumns.filter((c) => !requiredColumns.includes(c)).join(', ')}</code> are
            optional. Times are ISO 8601 with their offset (<code>2026-11-30T18:45:00+00:00</code>);{' '}
            <code>source</code> is <code>home-test</code> or <code>visit</code>. A file downloaded above
            imports as it is.
          </p>
          <p className="mt-1" id={`${inputId}-parameters`}>
            Parameters:
          </p>
          {/* One item each, so the list wraps on a phone instead of running off the screen. */}
          <ul aria-labelledby={`${inputId}-parameters`} className="mt-1 flex flex-wrap gap-x-2 gap-y-1">
            {parameterKeys.map((key: ParameterKey) => (
              <li key={key}>
                <code>{key}</code>
              </li>
            ))}
          </ul>
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
              <p className="text-sm text-ink-700">
                Columns not imported: {parsed.ignoredColumns.join(', ')}.
              </p>
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
                      {rows.map((row, index) => {
                        const issues = [
                          ...row.issues.map((i) => (i.column ? `${i.column}: ${i.message}` : i.message)),
                          ...serverProblems[index]!,
                        ];
                        const name =
                          parameterCatalogue[row.cells.parameter as ParameterKey]?.label ??
                          row.cells.parameter;
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
                <SubmitButton pending="Importing…" disabled={!ready || importing.isSuccess}>
                  {`Import ${rows.length} reading${rows.length === 1 ? '' : 's'}`}
                </SubmitButton>
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
      </Form>
    </section>
  );
}
