import { useState } from 'react';
import { useFormContext, useWatch } from 'react-hook-form';
import { Link } from 'react-router';
import { formatMoney } from '@shared/billing/money';
import type { UrgentSettingsView } from '@shared/schemas/urgent-requests';
import {
  defaultFirstAid,
  urgentCategories,
  urgentCategoryNames,
  type UrgentCategory,
} from '@shared/urgent/categories';
import { Badge } from '../../../components/badge';
import { Button } from '../../../components/button';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { DecimalField, TextAreaField } from '../../../components/form-fields';
import { SectionCard } from '../../../components/section-card';
import { ErrorState, LoadingState } from '../../../components/states';
import { useUrgentSettings } from '../api/get-urgent-settings';
import { useSaveUrgentSettings } from '../api/save-urgent-settings';
import {
  isDefaultText,
  linesText,
  settingsFieldFor,
  settingsFormSchema,
  settingsFormValues,
  type SettingsFormValues,
} from '../utils/settings-form';

/** One category's first aid: steps and cautions, one per line, with the way back to the default. */
function FirstAidFields({ category }: { category: UrgentCategory }) {
  const { setValue, formState } = useFormContext<SettingsFormValues>();
  const text = useWatch<SettingsFormValues, `firstAid.${UrgentCategory}`>({ name: `firstAid.${category}` });
  const isDefault = isDefaultText(category, text);
  const reset = () => {
    const options = { shouldDirty: true, shouldValidate: formState.isSubmitted };
    setValue(`firstAid.${category}.steps`, linesText(defaultFirstAid[category].steps), options);
    setValue(`firstAid.${category}.cautions`, linesText(defaultFirstAid[category].cautions), options);
  };
  return (
    <SectionCard title={urgentCategoryNames[category].label} hint={urgentCategoryNames[category].hint}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        {isDefault ? (
          <Badge tone="border border-ink-300 bg-ink-50 text-ink-900" mark={<span>○</span>}>
            Default text (common practice)
          </Badge>
        ) : (
          <Badge tone="border border-brine-700/30 bg-brine-100 text-brine-700" mark={<span>●</span>}>
            Your company’s text
          </Badge>
        )}
        <Button tone="secondary" onClick={reset} disabled={isDefault}>
          Reset to default<span className="sr-only"> for {urgentCategoryNames[category].label}</span>
        </Button>
      </div>
      <div className="grid gap-4 lg:grid-cols-2">
        <TextAreaField<SettingsFormValues>
          name={`firstAid.${category}.steps`}
          label="Steps, in order"
          hint="One step per line, first things first."
          rows={7}
        />
        <TextAreaField<SettingsFormValues>
          name={`firstAid.${category}.cautions`}
          label="Safety cautions"
          hint="One per line. Shown above the steps, marked as a caution."
          rows={7}
        />
      </div>
    </SectionCard>
  );
}

function SettingsForm({ settings }: { settings: UrgentSettingsView }) {
  const save = useSaveUrgentSettings();
  const [saved, setSaved] = useState(false);
  const form = useZodForm(settingsFormSchema, { defaultValues: settingsFormValues(settings) });
  return (
    <Form
      form={form}
      aria-label="Urgent visit settings"
      className="grid grid-cols-[minmax(0,1fr)] gap-4"
      fieldFor={settingsFieldFor}
      onChange={() => setSaved(false)}
      onSubmit={async (input) => {
        setSaved(false);
        const next = await save.mutateAsync(input);
        form.reset(settingsFormValues(next));
        setSaved(true);
      }}
    >
      <SectionCard title="Response and fee">
        <DecimalField<SettingsFormValues>
          name="ackTargetMinutes"
          label="Acknowledge within"
          hint="From 5 to 1440 minutes. Requests waiting longer are marked over target on the board."
          suffix="min"
          className="sm:max-w-xs"
        />
        <p className="text-ink-900">
          The call-out fee is set on the{' '}
          <Link to="/console/billing" className="font-bold text-brine-700">
            price list
          </Link>
          . Owners see it before they send a request; it is{' '}
          {settings.callOutFeeCents === null || settings.callOutFeeCents === 0 ? (
            'none at the moment'
          ) : (
            <strong>{formatMoney(settings.callOutFeeCents, settings.currency)}</strong>
          )}
          .
        </p>
      </SectionCard>
      <div>
        <h2 className="text-xl font-bold text-ink-900">First aid by category</h2>
        <p className="mt-1 text-ink-700">
          Owners see these the moment they choose what is happening, before they send anything. The defaults
          are common practice in tank keeping and general electrical safety; rewrite them in your company’s
          words, and keep the safety cautions. The note that wiring faults are for a licensed electrician is
          always shown with them.
        </p>
      </div>
      {urgentCategories.map((category) => (
        <FirstAidFields key={category} category={category} />
      ))}
      <div className="grid gap-2">
        <FormProblem />
        {saved && (
          <p role="status" className="font-bold text-healthy-700">
            Saved. Owners see the new text from now on.
          </p>
        )}
        <SubmitButton pending="Saving…" className="sm:justify-self-end">
          Save settings
        </SubmitButton>
      </div>
    </Form>
  );
}

/** The company's urgent-visit settings (admins): response target and first aid; the fee is on the price list. */
export function UrgentSettingsEditor() {
  const settings = useUrgentSettings();
  if (settings.isPending) return <LoadingState label="Loading the settings…" />;
  if (settings.isError)
    return (
      <ErrorState
        error={settings.error}
        what="the urgent visit settings"
        onRetry={() => void settings.refetch()}
      />
    );
  return <SettingsForm settings={settings.data} />;
}
