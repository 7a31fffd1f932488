import { checkOneOf } from './range-check';

/**
 * PSS-78 and EOS-80 were published on the 1968 temperature scale, while thermometers today report
 * ITS-90. Over the ocean range the scales differ by a factor: t68 = 1.00024 · t90 (the conversion
 * named in REFERENCES.md; attributed to Saunders 1990, WOCE Newsletter 10 — from memory).
 */
export type TemperatureScale = 'ITS-90' | 'IPTS-68';

export interface TemperatureScaleOptions {
  /** Scale of every temperature argument. 'IPTS-68' evaluates the equation exactly as published. */
  readonly temperatureScale?: TemperatureScale;
}

const temperatureScales: readonly TemperatureScale[] = ['ITS-90', 'IPTS-68'];

export function toIpts68(tempC: number, opts: TemperatureScaleOptions | undefined): number {
  const scale = checkOneOf('temperatureScale', opts?.temperatureScale ?? 'ITS-90', temperatureScales);
  return scale === 'IPTS-68' ? tempC : 1.00024 * tempC;
}
