import { describe, expect, it } from 'vitest';
import {
  deviceReadingBatch,
  deviceReadingInput,
  manualReadingBatch,
  manualReadingInput,
  type ManualReadingInput,
} from '@shared/schemas/readings';
import { readingSource } from '@shared/readings/sources';

function manualReading(overrides: Partial<ManualReadingInput> = {}): ManualReadingInput {
  return {
    parameter: 'temperature',
    value: 25.6,
    unit: '°C',
    measuredAt: '2026-12-01T08:00:00Z',
    ...overrides,
  };
}

function issuePaths(result: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }): string[] {
  return result.error?.issues.map((issue) => issue.path.join('.')) ?? [];
}

describe('readingSource', () => {
  it('knows visits, home tests and devices', () => {
    expect(readingSource.options).toEqual(['visit', 'home-test', 'device']);
  });
});

describe('manualReadingInput', () => {
  it('accepts a home-test reading with a method and a note', () => {
    const reading = manualReading({ method: 'glass thermometer', note: 'Before the water change' });

    expect(manualReadingInput.parse(reading)).toEqual(reading);
  });

  it('accepts a specific-gravity reading that states both temperatures', () => {
    const result = manualReadingInput.safeParse(
      manualReading({
        parameter: 'salinity',
        value: 1.026,
        unit: 'specific gravity',
        sampleTempC: 25,
        referenceTempC: 25,
      }),
    );

    expect(result.success).toBe(true);
  });

  it('asks for the sample and reference temperatures of a specific-gravity reading', () => {
    const result = manualReadingInput.safeParse(
      manualReading({ parameter: 'salinity', value: 1.026, unit: 'specific gravity', sampleTempC: 25 }),
    );

    expect(issuePaths(result)).toEqual(['referenceTempC']);
  });

  it('rejects a unit the parameter does not take, on the unit field', () => {
    const result = manualReadingInput.safeParse(manualReading({ unit: 'dKH' }));

    expect(issuePaths(result)).toEqual(['unit']);
    expect(result.error?.issues[0]?.message).toMatch(/use one of '°C', '°F'/);
  });

  it('rejects a value no tank can read, on the value field', () => {
    const result = manualReadingInput.safeParse(manualReading({ value: 140, unit: '°F' }));

    expect(issuePaths(result)).toEqual(['value']);
    expect(result.error?.issues[0]?.message).toMatch(/60\.0 °C is outside what a tank can plausibly read/);
  });

  it('rejects a time without its offset', () => {
    expect(manualReadingInput.safeParse(manualReading({ measuredAt: '2026-12-01 08:00' })).success).toBe(
      false,
    );
    expect(
      manualReadingInput.safeParse(manualReading({ measuredAt: '2026-12-01T08:00:00+01:00' })).success,
    ).toBe(true);
  });
});

describe('manualReadingBatch', () => {
  it('takes between 1 and 50 readings', () => {
    const readings = (n: number) => ({ readings: Array.from({ length: n }, () => manualReading()) });

    expect(manualReadingBatch.safeParse(readings(0)).success).toBe(false);
    expect(manualReadingBatch.safeParse(readings(50)).success).toBe(true);
    expect(manualReadingBatch.safeParse(readings(51)).success).toBe(false);
  });
});

describe('deviceReadingBatch', () => {
  const deviceReading = {
    parameter: 'temperature',
    value: 25.6,
    unit: '°C',
    measuredAt: '2026-12-01T08:00:00Z',
  };

  it('takes between 1 and 1000 readings', () => {
    const readings = (n: number) => ({ readings: Array.from({ length: n }, () => deviceReading) });

    expect(deviceReadingBatch.safeParse(readings(0)).success).toBe(false);
    expect(deviceReadingBatch.safeParse(readings(1000)).success).toBe(true);
    expect(deviceReadingBatch.safeParse(readings(1001)).success).toBe(false);
  });

  it('accepts salinity as conductivity but not as specific gravity', () => {
    const conductivity = { ...deviceReading, parameter: 'salinity', value: 53, unit: 'conductivity mS/cm' };

    expect(deviceReadingInput.safeParse(conductivity).success).toBe(true);
    expect(
      issuePaths(deviceReadingInput.safeParse({ ...conductivity, value: 1.026, unit: 'specific gravity' })),
    ).toEqual(['unit']);
  });

  it('lets an implausible probe value through, so one faulty reading cannot block the batch', () => {
    expect(deviceReadingInput.safeParse({ ...deviceReading, value: -40 }).success).toBe(true);
  });
});
