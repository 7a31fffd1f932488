import { z } from 'zod';
import {
  urgentSettingsInput,
  type UrgentSettingsInput,
  type UrgentSettingsView,
} from '@shared/schemas/urgent-requests';
import { defaultFirstAid, urgentCategories, type UrgentCategory } from '@shared/urgent/categories';
import { decimalText } from '../../../lib/form-values';

/*
 * The settings as the screen holds them: the target as typed, and each category's steps and cautions
 * as text, one per line. Text equal to the default is sent as null, so the category keeps following
 * the default. The call-out fee is not here: it lives on the price list.
 */

const lines = (text: string) =>
  text
    .split('\n')
    .map((line) => line.trim())
    .filter(Boolean);

export const linesText = (items: readonly string[]) => items.join('\n');

const sameLines = (a: readonly string[], b: readonly string[]) =>
  a.length === b.length && a.every((line, index) => line === b[index]);

/** Whether a category's text on screen is the default (common practice) text. */
export const isDefaultText = (category: UrgentCategory, text: { steps: string; cautions: string }) =>
  sameLines(lines(text.steps), defaultFirstAid[category].steps) &&
  sameLines(lines(text.cautions), defaultFirstAid[category].cautions);

// The shared schema's limits per category, said here in lines.
const maxLines = 12;
const maxLineLength = 500;

const firstAidText = z.object({ steps: z.string(), cautions: z.string() });

export const settingsFormSchema = z
  .object({
    ackTargetMinutes: decimalText(urgentSettingsInput.shape.ackTargetMinutes),
    firstAid: z.object(
      Object.fromEntries(urgentCategories.map((c) => [c, firstAidText])) as Record<
        UrgentCategory,
        typeof firstAidText
      >,
    ),
  })
  .superRefine((form, context) => {
    // Said against the textarea, in lines, rather than against an item of the list it becomes.
    for (const category of urgentCategories) {
      for (const part of ['steps', 'cautions'] as const) {
        const items = lines(form.firstAid[category][part]);
        const path = ['firstAid', category, part];
        if (part === 'steps' && items.length === 0)
          context.addIssue({
            code: 'custom',
            path,
            message: 'Write at least one step, or reset to the default.',
          });
        if (items.length > maxLines)
          context.addIssue({ code: 'custom', path, message: `At most ${maxLines} lines.` });
        const long = items.findIndex((line) => line.length > maxLineLength);
        if (long >= 0)
          context.addIssue({
            code: 'custom',
            path,
            message: `Line ${long + 1} is longer than ${maxLineLength} characters.`,
          });
      }
    }
  })
  .transform((form): UrgentSettingsInput => ({
    ackTargetMinutes: form.ackTargetMinutes,
    firstAid: Object.fromEntries(
      urgentCategories.map((category) => {
        const text = form.firstAid[category];
        return [
          category,
          isDefaultText(category, text) ? null : { steps: lines(text.steps), cautions: lines(text.cautions) },
        ];
      }),
    ),
  }))
  .pipe(urgentSettingsInput);

export type SettingsFormValues = z.input<typeof settingsFormSchema>;

export function settingsFormValues(settings: UrgentSettingsView): SettingsFormValues {
  return {
    ackTargetMinutes: String(settings.ackTargetMinutes),
    firstAid: Object.fromEntries(
      urgentCategories.map((category) => [
        category,
        {
          steps: linesText(settings.firstAid[category].steps),
          cautions: linesText(settings.firstAid[category].cautions),
        },
      ]),
    ) as SettingsFormValues['firstAid'],
  };
}

/** `firstAid.leak.steps.2` lands under that category's steps. */
export function settingsFieldFor(path: string): string | null {
  const firstAid = /^firstAid\.(\w+)\.(steps|cautions)/.exec(path);
  if (firstAid) return `firstAid.${firstAid[1]}.${firstAid[2]}`;
  if (path === 'ackTargetMinutes') return path;
  return null;
}
