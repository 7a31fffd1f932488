/*
 * Brinewatch's own plain CSV for readings: one reading per line, a header naming the columns,
 * RFC 4180 quoting, times in ISO 8601 with their offset, values as entered with their unit.
 * An export can be imported again: the columns an import does not use are reported and ignored.
 */
import type { z } from 'zod';
import { importedReadingInput } from './entry';
import type { Reading } from './reading';
import type { ManualSource } from './sources';

export const importColumns = [
  'measured_at',
  'parameter',
  'value',
  'unit',
  'source',
  'method',
  'note',
  'sample_temp_c',
  'reference_temp_c',
] as const;
export type ImportColumn = (typeof importColumns)[number];

export const requiredColumns: readonly ImportColumn[] = ['measured_at', 'parameter', 'value', 'unit'];

export const exportColumns = [...importColumns, 'stored_value', 'recorded_by'] as const;

/**
 * A cell a spreadsheet would run as a formula is written with a leading apostrophe (OWASP, "CSV
 * Injection"). Only free text gets this: numbers may rightly start with a minus sign.
 */
export function guardText(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}

/** Undoes `guardText`, so an export imports back as it was. */
function unguardText(text: string | undefined): string | undefined {
  return text !== undefined && /^'[=+\-@\t\r]/.test(text) ? text.slice(1) : text;
}

function quote(cell: string): string {
  return /[",\r\n]/.test(cell) ? `"${cell.replaceAll('"', '""')}"` : cell;
}

export function csvLine(cells: readonly string[]): string {
  return `${cells.map(quote).join(',')}\r\n`;
}

export const csvHeaderLine = () => csvLine(exportColumns);

const numberCell = (value: number | null) => (value === null ? '' : String(value));

export function readingCsvLine(reading: Reading): string {
  return csvLine([
    reading.measuredAt,
    reading.parameter,
    numberCell(reading.enteredValue),
    reading.enteredUnit,
    reading.source,
    guardText(reading.method ?? ''),
    guardText(reading.note ?? ''),
    numberCell(reading.sampleTempC),
    numberCell(reading.referenceTempC),
    numberCell(reading.value),
    guardText(reading.recordedBy ?? ''),
  ]);
}

export interface CsvRecord {
  /** Line of the file the record starts on (the header is line 1). */
  line: number;
  cells: string[];
}

/** RFC 4180 records, allowing LF line ends, a byte-order mark and a missing final line end. */
export function parseCsv(text: string): CsvRecord[] {
  const source = text.startsWith('\uFEFF') ? text.slice(1) : text;
  const records: CsvRecord[] = [];
  let cells: string[] = [];
  let cell = '';
  let quoted = false;
  let line = 1;
  let recordLine = 1;
  let touched = false;
  const endRecord = () => {
    cells.push(cell);
    if (touched || cells.length > 1 || cell !== '') records.push({ line: recordLine, cells });
    cells = [];
    cell = '';
    touched = false;
  };
  for (let i = 0; i < source.length; i += 1) {
    const ch = source[i]!;
    if (quoted) {
      if (ch === '"') {
        if (source[i + 1] === '"') {
          cell += '"';
          i += 1;
        } else quoted = false;
      } else {
        if (ch === '\n') line += 1;
        cell += ch;
      }
      continue;
    }
    if (ch === '"') {
      quoted = true;
      touched = true;
    } else if (ch === ',') {
      cells.push(cell);
      cell = '';
      touched = true;
    } else if (ch === '\n' || ch === '\r') {
      if (ch === '\r' && source[i + 1] === '\n') i += 1;
      endRecord();
      line += 1;
      recordLine = line;
    } else {
      cell += ch;
    }
  }
  if (quoted) throw new SyntaxError(`a quoted cell that starts on line ${recordLine} is never closed`);
  if (cell !== '' || cells.length > 0 || touched) endRecord();
  return records;
}

export interface CsvRowIssue {
  column: ImportColumn | null;
  message: string;
}

export interface CsvRow {
  line: number;
  /** The reading ready to send, or null when the row has issues. */
  reading: z.infer<typeof importedReadingInput> | null;
  issues: CsvRowIssue[];
  /** The cells as read, for the preview. */
  cells: Partial<Record<ImportColumn, string>>;
}

export interface CsvImport {
  /** Problems with the file as a whole (no header, a missing column). */
  problems: string[];
  ignoredColumns: string[];
  rows: CsvRow[];
}

const decimal = /^[-+]?(\d+\.?\d*|\.\d+)$/;

function numberFrom(text: string): number | string {
  const trimmed = text.trim();
  return decimal.test(trimmed) ? Number(trimmed) : trimmed;
}

const fieldColumns: Record<string, ImportColumn> = {
  measuredAt: 'measured_at',
  parameter: 'parameter',
  value: 'value',
  unit: 'unit',
  source: 'source',
  method: 'method',
  note: 'note',
  sampleTempC: 'sample_temp_c',
  referenceTempC: 'reference_temp_c',
};

/**
 * Reads an import file into rows checked with the same schema the API uses, so the preview shows
 * the issues the server would report. Rows without a source take `defaultSource`.
 */
export function readingsFromCsv(text: string, defaultSource: ManualSource): CsvImport {
  let records: CsvRecord[];
  try {
    records = parseCsv(text);
  } catch (error) {
    return { problems: [(error as Error).message], ignoredColumns: [], rows: [] };
  }
  const [header, ...body] = records;
  if (!header) return { problems: ['the file is empty'], ignoredColumns: [], rows: [] };
  const names = header.cells.map((name) => name.trim().toLowerCase());
  const known = new Set<string>(importColumns);
  const missing = requiredColumns.filter((column) => !names.includes(column));
  const ignoredColumns = names.filter((name) => !known.has(name) && name !== '');
  if (missing.length > 0) {
    return {
      problems: [`the header needs the column${missing.length > 1 ? 's' : ''} ${missing.join(', ')}`],
      ignoredColumns,
      rows: [],
    };
  }
  const rows = body.map((record): CsvRow => {
    const cells: Partial<Record<ImportColumn, string>> = {};
    names.forEach((name, i) => {
      if (known.has(name)) cells[name as ImportColumn] = record.cells[i] ?? '';
    });
    const optional = (column: ImportColumn) => {
      const cell = cells[column]?.trim();
      return cell === undefined || cell === '' ? undefined : cell;
    };
    const optionalNumber = (column: ImportColumn) => {
      const cell = optional(column);
      return cell === undefined ? undefined : numberFrom(cell);
    };
    const candidate = {
      measuredAt: (cells.measured_at ?? '').trim(),
      parameter: (cells.parameter ?? '').trim(),
      value: numberFrom(cells.value ?? ''),
      unit: (cells.unit ?? '').trim(),
      source: optional('source') ?? defaultSource,
      method: unguardText(optional('method')),
      note: unguardText(optional('note')),
      sampleTempC: optionalNumber('sample_temp_c'),
      referenceTempC: optionalNumber('reference_temp_c'),
    };
    const parsed = importedReadingInput.safeParse(candidate);
    if (parsed.success) return { line: record.line, reading: parsed.data, issues: [], cells };
    return {
      line: record.line,
      reading: null,
      cells,
      issues: parsed.error.issues.map((issue) => ({
        column: fieldColumns[String(issue.path[0])] ?? null,
        message: issue.message,
      })),
    };
  });
  return { problems: [], ignoredColumns, rows };
}
