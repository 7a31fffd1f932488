import { litresFromImperialGallons, litresFromUsGallons, usGallonsFromLitres } from '@shared/chemistry/index';

/*
 * The units a tank's volume is given in. Plain values without zod (the request schema builds its
 * enum from `volumeUnits`), so a screen that only shows a volume does not load the validator.
 */

export const volumeUnits = ['litres', 'us-gallons', 'imperial-gallons'] as const;
export type VolumeUnit = (typeof volumeUnits)[number];

export const volumeUnitLabels: Readonly<Record<VolumeUnit, { short: string; long: string }>> = {
  litres: { short: 'L', long: 'litres' },
  'us-gallons': { short: 'US gal', long: 'US gallons' },
  'imperial-gallons': { short: 'imp gal', long: 'imperial gallons' },
};

export function litresFrom(value: number, unit: VolumeUnit): number {
  switch (unit) {
    case 'litres':
      return value;
    case 'us-gallons':
      return litresFromUsGallons(value);
    case 'imperial-gallons':
      return litresFromImperialGallons(value);
  }
}

export function volumeIn(litres: number, unit: VolumeUnit): number {
  switch (unit) {
    case 'litres':
      return litres;
    case 'us-gallons':
      return usGallonsFromLitres(litres);
    case 'imperial-gallons':
      return litres / litresFromImperialGallons(1);
  }
}
