import { z } from 'zod';
import { wallInstant, wallTimeOf } from '@shared/visits/recurrence';

/*
 * Arrival times are typed on the tank's wall clock, whatever the zone of the phone typing them: a
 * technician in another zone still promises "14:30" as the owner reads it.
 */

/** "2026-12-02T09:30" in `zone`, as a datetime-local field holds it. */
export function wallText(at: Date | string, zone: string): string {
  const { day, time } = wallTimeOf(new Date(at), zone);
  return `${day}T${time}`;
}

/** A datetime-local field's text on `zone`'s clock as an instant; blank is undefined. */
export function wallInstantText(zone: string, { required }: { required: boolean }) {
  return z.string().transform((text, context) => {
    if (text.trim() === '') {
      if (required) context.addIssue({ code: 'custom', message: 'Choose when a technician will arrive.' });
      return required ? z.NEVER : undefined;
    }
    const match = /^(\d{4}-\d\d-\d\d)T(\d\d:\d\d)/.exec(text);
    if (!match) {
      context.addIssue({ code: 'custom', message: 'Enter a date and a time.' });
      return z.NEVER;
    }
    try {
      return wallInstant(match[1]!, match[2]!, zone).toISOString();
    } catch {
      context.addIssue({ code: 'custom', message: 'Enter a date and a time.' });
      return z.NEVER;
    }
  });
}

/** "Europe/London" → "Europe/London time", the way a zone is named beside a time. */
export const zoneName = (zone: string) => `${zone.replace(/_/g, ' ')} time`;
