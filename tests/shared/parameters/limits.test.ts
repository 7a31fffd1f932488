import { describe, expect, it } from 'vitest';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import {
  limitTemplates,
  tankStyle,
  tankStyleLabels,
  tankStyles,
  tankStyleWaterType,
} from '@shared/parameters/limit-templates';
import { parameterLimits, type ParameterLimits } from '@shared/parameters/limits';
import { tankLimits } from '@shared/parameters/tank-limits';

const bounds = (overrides: Partial<ParameterLimits> = {}): ParameterLimits => ({
  warnLow: 24,
  warnHigh: 27,
  critLow: 22,
  critHigh: 28.5,
  ...overrides,
});

describe('parameterLimits', () => {
  it('accepts a critical band outside the warning band', () => {
    expect(parameterLimits.safeParse(bounds()).success).toBe(true);
  });

  it('accepts a side that goes straight to critical, or has no limit at all', () => {
    expect(parameterLimits.safeParse(bounds({ critLow: 24 })).success).toBe(true);
    expect(parameterLimits.safeParse(bounds({ warnLow: null, critLow: null })).success).toBe(true);
    expect(
      parameterLimits.safeParse(bounds({ warnLow: null, warnHigh: null, critLow: null, critHigh: null }))
        .success,
    ).toBe(true);
  });

  it.each([
    ['critLow above warnLow', { critLow: 25 }, 'critLow'],
    ['critHigh below warnHigh', { critHigh: 26 }, 'critHigh'],
    ['warnLow not below warnHigh', { warnLow: 27 }, 'warnHigh'],
    ['critLow above warnHigh with no warnLow', { warnLow: null, critLow: 27.5 }, 'warnHigh'],
  ])('rejects %s', (_, overrides, path) => {
    const result = parameterLimits.safeParse(bounds(overrides));

    expect(result.success).toBe(false);
    expect(result.error?.issues.map((issue) => issue.path.join('.'))).toContain(path);
  });
});

describe('tankLimits', () => {
  it('rejects a limit outside what the parameter can plausibly read', () => {
    const result = tankLimits.safeParse({ temperature: bounds({ critHigh: 60 }) });

    expect(result.error?.issues.map((issue) => issue.path.join('.'))).toEqual(['temperature.critHigh']);
  });
});

describe('limitTemplates', () => {
  it('has a template and a plain label for every tank style', () => {
    expect(tankStyle.options).toEqual([...tankStyles]);
    for (const style of tankStyles) {
      expect(tankStyleLabels[style]).toMatch(/^[A-Z]/);
      expect(Object.keys(limitTemplates[style]).length).toBeGreaterThan(0);
    }
  });

  it('passes the limits schema for every style', () => {
    for (const style of tankStyles) expect(tankLimits.safeParse(limitTemplates[style]).success).toBe(true);
  });

  it('only watches parameters that apply to the style’s water', () => {
    for (const style of tankStyles) {
      for (const parameter of Object.keys(limitTemplates[style]) as ParameterKey[]) {
        expect(parameterCatalogue[parameter].waterTypes).toContain(tankStyleWaterType[style]);
      }
    }
  });

  it('is stricter for small-polyp stony corals than for a fish-only tank', () => {
    const sps = limitTemplates['sps-reef'].nitrate!;
    const fishOnly = limitTemplates['fish-only-marine'].nitrate!;

    expect(sps.warnHigh!).toBeLessThan(fishOnly.warnHigh!);
  });
});
