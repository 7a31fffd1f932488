import { volumeIn, volumeUnitLabels, type VolumeUnit } from '@shared/schemas/tanks';

const numberFormat = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 1 });

/** "300 L (79.3 US gal)": litres first, the way the company stores it, with gallons alongside. */
export function formatVolume(litres: number, also: VolumeUnit = 'us-gallons'): string {
  const main = `${numberFormat.format(litres)} L`;
  if (litres === 0) return main;
  return `${main} (${numberFormat.format(volumeIn(litres, also))} ${volumeUnitLabels[also].short})`;
}

export function formatNumber(value: number, digits = 1): string {
  return new Intl.NumberFormat('en-GB', { maximumFractionDigits: digits }).format(value);
}

/** A date-only value ("2025-04-12") as people read it; no time zone can move a calendar day. */
export function formatDay(isoDay: string | null): string {
  if (!isoDay) return '—';
  return new Intl.DateTimeFormat('en-GB', {
    day: 'numeric',
    month: 'short',
    year: 'numeric',
    timeZone: 'UTC',
  }).format(new Date(`${isoDay}T00:00:00Z`));
}

/** A moment shown in the tank's own time zone, so a note reads as it did at the tank. */
export function formatMoment(iso: string, timeZone: string): string {
  return new Intl.DateTimeFormat('en-GB', {
    day: 'numeric',
    month: 'short',
    year: 'numeric',
    timeZone,
  }).format(new Date(iso));
}

export function todayIn(timeZone: string): string {
  return new Intl.DateTimeFormat('en-CA', {
    timeZone,
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
  }).format(new Date());
}

/** "the yellow tang" → "Yellow tang" for headings. */
export function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
