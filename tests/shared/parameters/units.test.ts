import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parameterKeys } from '@shared/parameters/keys';
import {
  checkStoredValue,
  entryUnits,
  formatValue,
  fromStored,
  toStored,
  UnitNotAllowedError,
} from '@shared/parameters/units';

const at25 = { sampleTempC: 25, referenceTempC: 25 };

describe('toStored', () => {
  it('reads specific gravity 1.026 at 25 °C against a 25 °C reference as salinity 34.5 (EOS-80, UNESCO Tech. Pap. 44)', () => {
    const stored = toStored('salinity', 1.026, 'specific gravity', at25);

    expect(stored.value).toBeCloseTo(34.5, 1);
    expect(stored.note).toBe('Entered as specific gravity 1.026 at 25 °C (reference 25 °C).');
  });

  it('reads the same 1.026 against a 4 °C reference as salinity 38.5 (EOS-80, UNESCO Tech. Pap. 44)', () => {
    expect(
      toStored('salinity', 1.026, 'specific gravity', { sampleTempC: 25, referenceTempC: 4 }).value,
    ).toBeCloseTo(38.5, 1);
  });

  it('refuses specific gravity without both temperatures', () => {
    expect(() => toStored('salinity', 1.026, 'specific gravity', { sampleTempC: 25 })).toThrow(
      /referenceTempC/,
    );
  });

  it('reads conductivity of standard seawater, 42.914 mS/cm at 15 °C, as salinity 35 (Culkin & Smith 1980; PSS-78)', () => {
    // Within 0.005: the thermometer's 15 °C (ITS-90) is 15.0036 °C on the IPTS-68 scale PSS-78 was fitted on.
    expect(toStored('salinity', 42.914, 'conductivity mS/cm', { sampleTempC: 15 }).value).toBeCloseTo(35, 2);
  });

  it('takes conductivity at 25 °C, the usual meter compensation, when no temperature is given', () => {
    expect(toStored('salinity', 53, 'conductivity mS/cm').value).toBe(
      toStored('salinity', 53, 'conductivity mS/cm', { sampleTempC: 25 }).value,
    );
  });

  it('converts °F to °C and says how the value was entered', () => {
    expect(toStored('temperature', 77, '°F')).toEqual({ value: 25, note: 'Entered as 77 °F.' });
  });

  it('converts alkalinity from meq/L and mg/L CaCO3 to dKH (1 dKH = 10 mg/L CaO = 0.35665 meq/L)', () => {
    expect(toStored('alkalinity', 1, 'meq/L').value).toBeCloseTo(2.804, 3);
    expect(toStored('alkalinity', 50.043, 'mg/L CaCO3').value).toBeCloseTo(2.804, 3);
    expect(toStored('kh', 2.5, 'meq/L').value).toBeCloseTo(7.01, 2);
  });

  it('converts nitrate as N and phosphate as P to the ions (CIAAW 2021 molar masses)', () => {
    expect(toStored('nitrate', 1, 'mg/L NO3-N').value).toBeCloseTo(4.4266, 4);
    expect(toStored('phosphate', 1, 'mg/L P').value).toBeCloseTo(3.066, 3);
  });

  it('keeps a value entered in the stored unit as it is, with no note', () => {
    expect(toStored('calcium', 420, 'mg/L')).toEqual({ value: 420 });
    expect(toStored('ph', 8.2, '')).toEqual({ value: 8.2 });
  });

  it('refuses a unit the parameter does not take, naming the allowed ones', () => {
    const attempt = (): unknown => toStored('temperature', 25, 'K');

    expect(attempt).toThrow(UnitNotAllowedError);
    expect(attempt).toThrow(RangeError);
    expect(attempt).toThrow("Temperature cannot be entered in 'K'; use one of '°C', '°F'");
  });
});

describe('fromStored', () => {
  it('shows salinity 35 as specific gravity 1.0264 at 25/25 °C by default', () => {
    expect(formatValue('salinity', 35, { unit: 'specific gravity' })).toBe('1.0264 SG');
  });

  it('switches display units for temperature and alkalinity', () => {
    expect(fromStored('temperature', 25, '°F')).toBeCloseTo(77, 10);
    expect(fromStored('alkalinity', 2.804, 'meq/L')).toBeCloseTo(1, 3);
  });

  it('undoes toStored for every parameter and entry unit', () => {
    for (const parameter of parameterKeys) {
      for (const unit of entryUnits[parameter]) {
        fc.assert(
          fc.property(fc.double({ min: 0.2, max: 0.8, noNaN: true }), (share) => {
            // Salinity 10…34 stays inside PSS-78 and EOS-80 for every unit.
            const stored = parameter === 'salinity' ? 10 + 30 * share : 30 * share;
            const shown = fromStored(parameter, stored, unit, at25);

            expect(toStored(parameter, shown, unit, at25).value).toBeCloseTo(stored, 6);
          }),
          { numRuns: 20 },
        );
      }
    }
  });
});

describe('formatValue', () => {
  it('writes the stored unit with the catalogue decimals', () => {
    expect(formatValue('temperature', 25.04)).toBe('25.0 °C');
    expect(formatValue('salinity', 35.04)).toBe('35.0 ppt');
    expect(formatValue('ph', 8.2)).toBe('8.20');
    expect(formatValue('nitrate', 5)).toBe('5.0 mg/L NO3');
  });

  it('trims trailing zeros for limits and never shows "-0"', () => {
    expect(formatValue('temperature', 28, { trim: true })).toBe('28 °C');
    expect(formatValue('orp', -0.2)).toBe('0 mV');
  });
});

describe('checkStoredValue', () => {
  it('sets aside a value outside what a tank can plausibly read', () => {
    expect(checkStoredValue('temperature', 140, '°C')).toEqual({
      ok: false,
      field: 'value',
      message:
        'Temperature 140.0 °C is outside what a tank can plausibly read (0 °C to 45 °C); check the value and its unit',
    });
  });

  it('points at the unit when the unit is wrong and at the value when the chemistry refuses it', () => {
    expect(checkStoredValue('ph', 8, 'mV')).toMatchObject({ ok: false, field: 'unit' });
    expect(checkStoredValue('nitrate', -1, 'mg/L NO3-N')).toMatchObject({ ok: false, field: 'value' });
  });

  it('words a refused conversion for the person who typed it, without naming the equation', () => {
    const refused = checkStoredValue('salinity', 1.04, 'specific gravity', {
      sampleTempC: 25,
      referenceTempC: 25,
    });

    expect(refused).toEqual({
      ok: false,
      field: 'value',
      message:
        'Salinity 1.04 SG cannot be converted: it must be between 1 and 1.03169 SG; check the value and its unit',
    });
    expect(checkStoredValue('nitrate', -1, 'mg/L NO3-N')).toMatchObject({
      message: expect.not.stringMatching(/EOS-80|PSS-78|validity|, got /),
    });
  });

  it('passes a good value on with its note', () => {
    expect(checkStoredValue('temperature', 77, '°F')).toEqual({
      ok: true,
      value: 25,
      note: 'Entered as 77 °F.',
    });
  });
});
