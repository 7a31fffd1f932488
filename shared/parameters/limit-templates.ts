/*
 * Default limits for each style of tank, in stored units (°C, practical salinity, dKH, mg/L,
 * mg/L NO3, mg/L PO4, mV, °dGH, °dKH). Target ranges for aquaria have no standard: these are
 * common practice, written from memory by the Brinewatch team, as a starting point the company
 * adjusts for each tank and its livestock. A parameter a style leaves out is not watched by
 * default.
 */
import { z } from 'zod';
import type { ParameterLimits } from './limits';
import type { TankLimits } from './tank-limits';
import type { WaterType } from './water-types';

export const tankStyles = [
  'sps-reef',
  'mixed-reef',
  'soft-lps-reef',
  'fish-only-marine',
  'planted-freshwater',
  'community-freshwater',
  'brackish',
] as const;
export const tankStyle = z.enum(tankStyles);
export type TankStyle = z.infer<typeof tankStyle>;

export const tankStyleLabels: Readonly<Record<TankStyle, string>> = {
  'sps-reef': 'Reef with small-polyp stony corals',
  'mixed-reef': 'Mixed reef',
  'soft-lps-reef': 'Reef with soft and large-polyp stony corals',
  'fish-only-marine': 'Marine fish only',
  'planted-freshwater': 'Planted freshwater',
  'community-freshwater': 'Community freshwater',
  brackish: 'Brackish',
};

export const tankStyleWaterType: Readonly<Record<TankStyle, WaterType>> = {
  'sps-reef': 'marine',
  'mixed-reef': 'marine',
  'soft-lps-reef': 'marine',
  'fish-only-marine': 'marine',
  'planted-freshwater': 'fresh',
  'community-freshwater': 'fresh',
  brackish: 'brackish',
};

export const limitTemplatesSource =
  'Common practice, from memory: starting limits chosen by the Brinewatch team, not a published ' +
  'standard. Adjust them for each tank and what lives in it.';

const limits = (
  warnLow: number | null,
  warnHigh: number | null,
  critLow: number | null,
  critHigh: number | null,
): ParameterLimits => ({ warnLow, warnHigh, critLow, critHigh });

// Shared by the three reef styles; each overrides what its corals are fussier about.
const reefCommon = {
  salinity: limits(34, 36, 32.5, 37),
  ammonia: limits(null, 0.05, null, 0.25),
  nitrite: limits(null, 0.1, null, 0.5),
  orp: limits(250, 450, 150, 500),
} satisfies TankLimits;

export const limitTemplates: Readonly<Record<TankStyle, TankLimits>> = {
  'sps-reef': {
    ...reefCommon,
    temperature: limits(24.5, 27, 23, 28.5),
    ph: limits(7.9, 8.45, 7.7, 8.6),
    alkalinity: limits(7, 9.5, 6, 11),
    calcium: limits(380, 470, 340, 520),
    magnesium: limits(1250, 1450, 1150, 1550),
    nitrate: limits(1, 15, null, 30),
    phosphate: limits(0.02, 0.12, null, 0.25),
  },
  'mixed-reef': {
    ...reefCommon,
    temperature: limits(24, 27.5, 22.5, 29),
    ph: limits(7.85, 8.45, 7.6, 8.6),
    alkalinity: limits(7, 11, 6, 12.5),
    calcium: limits(380, 470, 340, 520),
    magnesium: limits(1200, 1450, 1100, 1550),
    nitrate: limits(1, 20, null, 40),
    phosphate: limits(0.02, 0.15, null, 0.3),
  },
  'soft-lps-reef': {
    ...reefCommon,
    salinity: limits(33.5, 36, 32, 37),
    temperature: limits(24, 27.5, 22.5, 29),
    ph: limits(7.8, 8.45, 7.6, 8.6),
    alkalinity: limits(7.5, 11.5, 6, 13),
    calcium: limits(370, 470, 320, 520),
    magnesium: limits(1150, 1450, 1050, 1550),
    nitrate: limits(2, 25, null, 50),
    phosphate: limits(0.03, 0.2, null, 0.5),
  },
  'fish-only-marine': {
    temperature: limits(24, 27.5, 22, 29.5),
    salinity: limits(31, 36, 29, 37),
    ph: limits(7.8, 8.5, 7.6, 8.7),
    alkalinity: limits(6.5, 12, 5, 14),
    nitrate: limits(null, 40, null, 80),
    phosphate: limits(null, 0.5, null, 1.5),
    ammonia: limits(null, 0.1, null, 0.5),
    nitrite: limits(null, 0.2, null, 1),
    orp: limits(200, 450, 100, 500),
  },
  'planted-freshwater': {
    temperature: limits(22, 27, 20, 29.5),
    ph: limits(6.2, 7.6, 5.6, 8.2),
    gh: limits(4, 12, 2, 18),
    kh: limits(2, 8, 1, 12),
    // Plants feed on nitrate and phosphate, so running out is worth a warning here.
    nitrate: limits(5, 30, null, 50),
    phosphate: limits(0.2, 2, null, 3),
    ammonia: limits(null, 0.1, null, 0.5),
    nitrite: limits(null, 0.1, null, 0.5),
  },
  'community-freshwater': {
    temperature: limits(23, 27, 20, 29.5),
    ph: limits(6.5, 7.8, 6, 8.4),
    gh: limits(4, 15, 2, 20),
    kh: limits(3, 10, 1, 15),
    nitrate: limits(null, 40, null, 80),
    phosphate: limits(null, 1, null, 3),
    ammonia: limits(null, 0.1, null, 0.5),
    nitrite: limits(null, 0.1, null, 0.5),
  },
  brackish: {
    temperature: limits(24, 28, 22, 30),
    salinity: limits(5, 20, 3, 25),
    ph: limits(7.5, 8.4, 7, 8.8),
    kh: limits(6, 15, 4, 20),
    nitrate: limits(null, 40, null, 80),
    ammonia: limits(null, 0.1, null, 0.5),
    nitrite: limits(null, 0.2, null, 1),
  },
};
