import { z } from 'zod';
import {
  careTipInput,
  tipAudience,
  tipCategories,
  type CareTip,
  type CareTipInput,
  type TipAudience,
  type TipTrigger,
} from '@shared/schemas/care-tips';
import { livestockGroup, type LivestockGroup } from '@shared/livestock/species';
import { visitTask, type VisitTask } from '@shared/schemas/visits';
import { instantFromLocalInput, localInputValue } from '../../../lib/format';

/*
 * The composer's form: the shared `careTipInput` laid out as fields (the audience's kind and each
 * kind's own choice side by side, the triggers as two lists of ticks), plus when to send. It hands
 * `onSubmit` the exact request and what to do with it.
 */

export const audienceKinds = ['all', 'style', 'species', 'equipment', 'tanks'] as const;
export type AudienceKind = (typeof audienceKinds)[number];

const fields = careTipInput.shape;
const maxTriggers = 10;

const tipFormFields = z.object({
  title: fields.title,
  body: fields.body,
  category: z.enum(tipCategories, { error: 'choose a category' }),
  photoId: z.uuid().nullable(),
  /** The tank whose photos are shown to choose from; only the photo itself is sent. */
  photoTankId: z.string(),
  audienceKind: z.enum(audienceKinds, { error: 'choose who it is for' }),
  style: z.string(),
  speciesId: z.string(),
  equipmentKind: z.string(),
  tankIds: z.array(z.string()),
  suggestGroups: z.array(livestockGroup),
  suggestTasks: z.array(visitTask),
  /** Which button sent the form: keep it as a draft, or send it. */
  intent: z.enum(['save', 'send']),
  when: z.enum(['now', 'later']),
  /** A datetime-local value: the device's own clock. */
  sendAt: z.string(),
});
export type TipFormValues = z.input<typeof tipFormFields>;

/** The audience the fields describe, or null while its kind's own choice is still missing. */
export function audienceOf(
  values: Pick<TipFormValues, 'audienceKind' | 'style' | 'speciesId' | 'equipmentKind' | 'tankIds'>,
): TipAudience | null {
  const candidate =
    values.audienceKind === 'all'
      ? { kind: 'all' }
      : values.audienceKind === 'style'
        ? { kind: 'style', style: values.style }
        : values.audienceKind === 'species'
          ? { kind: 'species', speciesId: values.speciesId }
          : values.audienceKind === 'equipment'
            ? { kind: 'equipment', equipmentKind: values.equipmentKind }
            : { kind: 'tanks', tankIds: values.tankIds };
  const parsed = tipAudience.safeParse(candidate);
  return parsed.success ? parsed.data : null;
}

const missingChoice: Record<Exclude<AudienceKind, 'all'>, { field: keyof TipFormValues; message: string }> = {
  style: { field: 'style', message: 'choose a style of tank' },
  species: { field: 'speciesId', message: 'find and choose a species' },
  equipment: { field: 'equipmentKind', message: 'choose a kind of equipment' },
  tanks: { field: 'tankIds', message: 'tick at least one tank' },
};

export const tipFormSchema = tipFormFields
  .superRefine(
    (values, context) => {
      // Checked even while other fields are refused, so every problem shows on the first try.
      const kind = values.audienceKind as AudienceKind | undefined;
      if (kind && kind !== 'all' && audienceOf(values) === null) {
        const { field, message } = missingChoice[kind];
        context.addIssue({ code: 'custom', path: [field], message });
      }
      if ((values.suggestGroups?.length ?? 0) + (values.suggestTasks?.length ?? 0) > maxTriggers) {
        context.addIssue({
          code: 'custom',
          path: ['suggestGroups'],
          message: `at most ${maxTriggers} suggestions in all`,
        });
      }
      if (values.intent === 'send' && values.when === 'later') {
        const at = instantFromLocalInput(values.sendAt ?? '');
        if (at === null)
          context.addIssue({ code: 'custom', path: ['sendAt'], message: 'choose a day and a time' });
        else if (Date.parse(at) <= Date.now())
          context.addIssue({ code: 'custom', path: ['sendAt'], message: 'choose a time still to come' });
      }
    },
    { when: () => true },
  )
  .transform((values) => {
    const suggestWhen: TipTrigger[] = [
      ...values.suggestGroups.map((group): TipTrigger => ({ on: 'livestock-added', group })),
      ...values.suggestTasks.map((task): TipTrigger => ({ on: 'visit-task', task })),
    ];
    const input: CareTipInput = {
      title: values.title,
      body: values.body,
      category: values.category,
      photoId: values.photoId,
      // Complete by now: the check above refused the form otherwise.
      audience: audienceOf(values)!,
      suggestWhen,
    };
    return {
      input,
      intent: values.intent,
      at: values.when === 'later' ? instantFromLocalInput(values.sendAt) : null,
    };
  });

/** A new tip's fields, or an existing one's as saved. */
export function tipFormValues(tip: CareTip | null): TipFormValues {
  const audience = tip?.audience ?? { kind: 'all' };
  const triggers = tip?.suggestWhen ?? [];
  return {
    title: tip?.title ?? '',
    body: tip?.body ?? '',
    category: tip?.category ?? ('' as TipFormValues['category']),
    photoId: tip?.photoId ?? null,
    photoTankId: '',
    audienceKind: audience.kind,
    style: audience.kind === 'style' ? audience.style : '',
    speciesId: audience.kind === 'species' ? audience.speciesId : '',
    equipmentKind: audience.kind === 'equipment' ? audience.equipmentKind : '',
    tankIds: audience.kind === 'tanks' ? audience.tankIds : [],
    suggestGroups: triggers.flatMap((t): LivestockGroup[] => (t.on === 'livestock-added' ? [t.group] : [])),
    suggestTasks: triggers.flatMap((t): VisitTask[] => (t.on === 'visit-task' ? [t.task] : [])),
    intent: 'save',
    when: tip?.status === 'scheduled' ? 'later' : 'now',
    sendAt: tip?.status === 'scheduled' && tip.sendAt ? localInputValue(new Date(tip.sendAt)) : '',
  };
}

/** Where the API's issues go: `body.audience.style` under the style, `body.at` under the time. */
export function tipFieldFor(path: string): string | null {
  if (path === 'at') return 'sendAt';
  if (path === 'audience' || path === 'audience.kind') return 'audienceKind';
  if (path.startsWith('audience.tankIds')) return 'tankIds';
  if (path.startsWith('audience.')) {
    const field = path.slice('audience.'.length);
    return field === 'style' || field === 'speciesId' || field === 'equipmentKind' ? field : 'audienceKind';
  }
  if (path.startsWith('suggestWhen')) return 'suggestGroups';
  if (path === 'title' || path === 'body' || path === 'category' || path === 'photoId') return path;
  return null;
}
