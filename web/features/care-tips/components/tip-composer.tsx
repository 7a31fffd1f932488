import { useEffect, useRef, useState, type ReactNode } from 'react';
import { useFormContext, useFormState, useWatch } from 'react-hook-form';
import { useNavigate } from 'react-router';
import { livestockGroupLabels, livestockGroups } from '@shared/livestock/species';
import { tipCategories, tipCategoryLabels, type CareTip } from '@shared/schemas/care-tips';
import { visitTaskLabels, visitTasks } from '@shared/schemas/visits';
import { Button } from '../../../components/button';
import { SectionCard } from '../../../components/section-card';
import { Form, FormProblem, useZodForm } from '../../../components/form';
import { CheckboxGroupField, RadioGroupField, TextField } from '../../../components/form-fields';
import { formatDateTime, localInputValue } from '../../../lib/format';
import { useSaveCareTip } from '../api/save-care-tip';
import { useSendCareTip } from '../api/send-care-tip';
import { tipFieldFor, tipFormSchema, tipFormValues, type TipFormValues } from '../utils/tip-form';
import { AudienceFields } from './audience-fields';
import { BodyEditor } from './body-editor';
import { PhotoFields } from './photo-fields';

/** When staff are offered the tip for one tap; folded away until wanted. */
function TriggerFields() {
  const [groups, tasks] = useWatch<TipFormValues, ['suggestGroups', 'suggestTasks']>({
    name: ['suggestGroups', 'suggestTasks'],
  });
  const { errors } = useFormState<TipFormValues>({ name: 'suggestGroups' });
  const chosen = groups.length + tasks.length;
  // Open from the start when the tip already has some; after that, opening is the person's.
  const [startOpen] = useState(chosen > 0);
  const ref = useRef<HTMLDetailsElement>(null);
  const refused = errors.suggestGroups !== undefined;
  useEffect(() => {
    if (refused && ref.current) ref.current.open = true;
  }, [refused]);
  return (
    <details ref={ref} open={startOpen} className="group">
      <summary className="flex min-h-11 cursor-pointer list-none items-center gap-2 font-bold text-brine-700 [&::-webkit-details-marker]:hidden">
        <span aria-hidden="true" className="inline-block transition-transform group-open:rotate-90">
          ▸
        </span>
        {chosen === 0
          ? 'Choose when to suggest it (optional)'
          : `Suggested on ${chosen} occasion${chosen === 1 ? '' : 's'}`}
      </summary>
      <div className="mt-3 grid gap-4 md:grid-cols-2">
        <CheckboxGroupField<TipFormValues>
          name="suggestGroups"
          label="Livestock added"
          hint="When staff add an animal of these kinds to a tank."
          columns="mt-1 grid gap-1"
          options={livestockGroups.map((value) => ({ value, label: livestockGroupLabels[value] }))}
        />
        <CheckboxGroupField<TipFormValues>
          name="suggestTasks"
          label="A visit records"
          hint="When a published visit report ticks these tasks."
          columns="mt-1 grid gap-1"
          options={visitTasks.map((value) => ({ value, label: visitTaskLabels[value] }))}
        />
      </div>
    </details>
  );
}

const deviceZone = () => Intl.DateTimeFormat().resolvedOptions().timeZone.replace(/_/g, ' ');

function SendFields({ status }: { status: CareTip['status'] | null }) {
  const when = useWatch<TipFormValues, 'when'>({ name: 'when' });
  const { isSubmitting } = useFormState<TipFormValues>();
  return (
    <>
      <RadioGroupField<TipFormValues>
        name="when"
        label="When"
        look="tiles"
        options={[
          { value: 'now', label: 'Now' },
          { value: 'later', label: 'At a set time' },
        ]}
      />
      {when === 'later' && (
        <TextField<TipFormValues>
          name="sendAt"
          label="Send at"
          type="datetime-local"
          hint={`On this device’s clock (${deviceZone()}).`}
          min={localInputValue(new Date())}
          className="sm:max-w-xs"
        />
      )}
      <FormProblem />
      <div className="flex flex-col-reverse gap-2 sm:flex-row sm:justify-end">
        <IntentButton intent="save" tone="secondary" busy={isSubmitting}>
          {status === 'scheduled' ? 'Save changes' : 'Save draft'}
        </IntentButton>
        <IntentButton intent="send" busy={isSubmitting}>
          {when === 'later' ? 'Schedule it' : 'Send now'}
        </IntentButton>
      </div>
    </>
  );
}

/** A submit button that first says what the press means (keep as a draft, or send). */
function IntentButton({
  intent,
  tone,
  busy,
  children,
}: {
  intent: TipFormValues['intent'];
  tone?: 'secondary';
  busy: boolean;
  children: ReactNode;
}) {
  const { setValue, getValues } = useFormContext<TipFormValues>();
  const pending = busy && getValues('intent') === intent;
  return (
    <Button type="submit" tone={tone} disabled={busy} onClick={() => setValue('intent', intent)}>
      {pending ? (intent === 'save' ? 'Saving…' : 'Sending…') : children}
    </Button>
  );
}

/** What the detail page says on arrival from the composer. */
export interface ComposerNotice {
  notice: string;
}

/**
 * Writing a care tip, or changing one not yet sent: its words with a live preview, who it is for
 * with a live count, when staff are offered it, then keep it as a draft or send it (now or at a
 * set time). Sending saves first, so what is sent is what is on the screen.
 */
export function TipComposer({ tip }: { tip: CareTip | null }) {
  const navigate = useNavigate();
  const save = useSaveCareTip();
  const send = useSendCareTip();
  // Once saved, a retry changes that tip rather than writing a second one.
  const [savedId, setSavedId] = useState<string | null>(tip?.id ?? null);
  const form = useZodForm(tipFormSchema, { defaultValues: tipFormValues(tip) });
  const done = (id: string, notice: string) =>
    void navigate(`/console/tips/${id}`, { state: { notice } satisfies ComposerNotice });
  return (
    <Form
      form={form}
      aria-label={tip ? 'Change the care tip' : 'Write a care tip'}
      className="grid grid-cols-[minmax(0,1fr)] gap-4"
      fieldFor={tipFieldFor}
      onSubmit={async ({ input, intent, at }) => {
        const saved = await save.mutateAsync({ tipId: savedId, input });
        setSavedId(saved.id);
        if (intent === 'save') {
          done(saved.id, saved.status === 'scheduled' ? 'Changes saved.' : 'Draft saved.');
          return;
        }
        const sent = await send.mutateAsync({ tipId: saved.id, at });
        done(
          sent.id,
          sent.status === 'scheduled' && sent.sendAt
            ? `Scheduled for ${formatDateTime(sent.sendAt)}.`
            : 'Sent. The owners of the tanks it reaches are told.',
        );
      }}
    >
      <SectionCard title="The tip">
        <TextField<TipFormValues> name="title" label="Title" maxLength={160} autoComplete="off" />
        <RadioGroupField<TipFormValues>
          name="category"
          label="Category"
          look="tiles"
          options={tipCategories.map((value) => ({ value, label: tipCategoryLabels[value] }))}
        />
        <BodyEditor />
      </SectionCard>
      <SectionCard
        title="Photo"
        hint="Optional: one of a tank’s photos. Photos are uploaded on the tank’s page, not here."
      >
        <PhotoFields />
      </SectionCard>
      <SectionCard title="Who it is for">
        <AudienceFields />
      </SectionCard>
      <SectionCard
        title="Suggest it to staff"
        hint="Offered for one tap to staff at a tank that has not received it yet."
      >
        <TriggerFields />
      </SectionCard>
      <SectionCard title="Send">
        <SendFields status={tip?.status ?? null} />
      </SectionCard>
    </Form>
  );
}
