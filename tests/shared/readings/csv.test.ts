import { describe, expect, it } from 'vitest';
import { csvHeaderLine, parseCsv, readingCsvLine, readingsFromCsv } from '@shared/readings/csv';
import type { Reading } from '@shared/readings/reading';

const reading: Reading = {
  id: 1,
  parameter: 'salinity',
  value: 34.5,
  enteredValue: 1.026,
  enteredUnit: 'specific gravity',
  measuredAt: '2026-11-30T09:15:00.000Z',
  source: 'visit',
  recordedBy: 'Tomas',
  method: 'refractometer',
  note: 'topped up, "looks" fine',
  sampleTempC: 25,
  referenceTempC: 25,
};

describe('parseCsv', () => {
  it('reads RFC 4180 quoting, CRLF and LF line ends, a byte-order mark and quoted line breaks', () => {
    const text = '\uFEFFa,b\r\n"x, y","say ""hi"""\n"two\nlines",\n\n';
    expect(parseCsv(text)).toEqual([
      { line: 1, cells: ['a', 'b'] },
      { line: 2, cells: ['x, y', 'say "hi"'] },
      { line: 3, cells: ['two\nlines', ''] },
    ]);
  });

  it('says where an unclosed quote starts', () => {
    expect(() => parseCsv('a\n"open')).toThrow(/line 2/);
  });
});

describe('readingCsvLine', () => {
  it('writes the value as entered, its unit, and the stored value', () => {
    expect(csvHeaderLine()).toBe(
      'measured_at,parameter,value,unit,source,method,note,sample_temp_c,reference_temp_c,stored_value,recorded_by\r\n',
    );
    expect(readingCsvLine(reading)).toBe(
      '2026-11-30T09:15:00.000Z,salinity,1.026,specific gravity,visit,refractometer,"topped up, ""looks"" fine",25,25,34.5,Tomas\r\n',
    );
  });

  it('writes text that a spreadsheet would run as a formula with a leading apostrophe (OWASP, CSV Injection), numbers as they are', () => {
    const line = readingCsvLine({
      ...reading,
      parameter: 'orp',
      value: -20,
      enteredValue: -20,
      enteredUnit: 'mV',
      note: '@SUM(A1)',
    });
    expect(line).toContain(',-20,mV,');
    expect(line).toContain(",'@SUM(A1),");
  });
});

describe('readingsFromCsv', () => {
  it('reads our own export back into readings, ignoring the columns an import does not use', () => {
    const result = readingsFromCsv(csvHeaderLine() + readingCsvLine(reading), 'home-test');

    expect(result.problems).toEqual([]);
    expect(result.ignoredColumns).toEqual(['stored_value', 'recorded_by']);
    expect(result.rows).toEqual([
      {
        line: 2,
        issues: [],
        cells: expect.any(Object),
        reading: {
          parameter: 'salinity',
          value: 1.026,
          unit: 'specific gravity',
          measuredAt: '2026-11-30T09:15:00.000Z',
          source: 'visit',
          method: 'refractometer',
          note: 'topped up, "looks" fine',
          sampleTempC: 25,
          referenceTempC: 25,
        },
      },
    ]);
  });

  it('takes the default source, and an empty unit for pH', () => {
    const result = readingsFromCsv(
      'parameter,value,unit,measured_at\nph,8.15,,2026-11-30T08:00:00+01:00\n',
      'home-test',
    );
    expect(result.rows[0]!.reading).toMatchObject({
      parameter: 'ph',
      value: 8.15,
      unit: '',
      source: 'home-test',
    });
  });

  it('lists each bad row by its line with the column to fix', () => {
    const text = [
      'measured_at,parameter,value,unit,source',
      '2026-11-30T08:00:00Z,temperature,25.5,°C,visit',
      '30/11/2026 08:00,temperature,25.5,°C,visit',
      '2026-11-30T08:00:00Z,turbidity,3,NTU,visit',
      '2026-11-30T08:00:00Z,calcium,four hundred,mg/L,visit',
      '2026-11-30T08:00:00Z,salinity,1.026,specific gravity,visit',
      '2026-11-30T08:00:00Z,ph,8.1,,device',
    ].join('\n');

    const rows = readingsFromCsv(text, 'visit').rows;

    expect(rows.map((row) => [row.line, row.issues.map((i) => i.column)])).toEqual([
      [2, []],
      [3, ['measured_at']],
      [4, ['parameter']],
      [5, ['value']],
      [6, ['sample_temp_c', 'reference_temp_c']],
      [7, ['source']],
    ]);
    expect(rows[5]!.issues[0]!.message).toMatch(/device/);
  });

  it('names missing columns and an empty file', () => {
    expect(readingsFromCsv('parameter,value\nph,8\n', 'visit').problems).toEqual([
      'the header needs the columns measured_at, unit',
    ]);
    expect(readingsFromCsv('', 'visit').problems).toEqual(['the file is empty']);
  });
});
