import { useState } from 'react';
import { useWatch } from 'react-hook-form';
import { currencies } from '@shared/billing/money';
import type { BillingSettingsView } from '@shared/schemas/billing';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import {
  CheckboxField,
  DecimalField,
  SelectField,
  TextAreaField,
  TextField,
} from '../../../components/form-fields';
import { SectionCard } from '../../../components/section-card';
import { useSaveBillingSettings } from '../api/save-billing-settings';
import { settingsFormSchema, settingsFormValues, type SettingsFormValues } from '../utils/price-list-forms';

const currencyNames = new Intl.DisplayNames(['en-GB'], { type: 'currency' });
const currencyOptions = currencies.map((code) => ({
  value: code,
  label: `${code} — ${currencyNames.of(code) ?? code}`,
}));

/** Currency, tax, terms, the hourly rate and call-out fee, and who the invoices are from. */
export function BillingSettingsForm({ settings }: { settings: BillingSettingsView }) {
  const save = useSaveBillingSettings();
  const [saved, setSaved] = useState(false);
  const form = useZodForm(settingsFormSchema, { defaultValues: settingsFormValues(settings) });
  const currency = useWatch({ control: form.control, name: 'currency' });
  return (
    <Form
      form={form}
      aria-label="Billing settings"
      className="grid grid-cols-[minmax(0,1fr)] gap-4"
      onChange={() => setSaved(false)}
      onSubmit={async (input) => {
        setSaved(false);
        const next = await save.mutateAsync(input);
        form.reset(settingsFormValues(next));
        setSaved(true);
      }}
    >
      <SectionCard title="Currency and tax">
        <SelectField<SettingsFormValues>
          name="currency"
          label="Currency"
          disabled={settings.currencyLocked}
          hint={
            settings.currencyLocked
              ? `Fixed at ${settings.currency}: invoices have been issued in it.`
              : 'Every price and invoice is in this currency. Choose it before setting prices.'
          }
          options={currencyOptions}
        />
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField<SettingsFormValues>
            name="taxLabel"
            label="Tax name"
            hint="As invoices print it, such as VAT or GST."
            maxLength={20}
            autoComplete="off"
          />
          <DecimalField<SettingsFormValues>
            name="taxRate"
            label="Tax rate"
            hint="0 if you do not charge tax."
            suffix="%"
          />
        </div>
        <CheckboxField<SettingsFormValues>
          name="pricesIncludeTax"
          label="Prices include tax"
          hint="Ticked: the prices on this list are what clients pay, and each invoice shows the tax they contain. Not ticked: the tax is added on top of these prices."
        />
        <DecimalField<SettingsFormValues>
          name="paymentTermsDays"
          label="Payment terms"
          hint="Days clients have to pay once an invoice is issued; 0 means due on receipt."
          inputMode="numeric"
          suffix="days"
          className="sm:max-w-xs"
        />
      </SectionCard>
      <SectionCard title="Time and call-outs">
        <div className="grid gap-4 sm:grid-cols-2">
          <DecimalField<SettingsFormValues>
            name="hourlyRate"
            label="Hourly rate"
            hint="For visits other than routine service, charged per hour on site. Blank if you do not charge by the hour."
            suffix={currency}
          />
          <DecimalField<SettingsFormValues>
            name="callOutFee"
            label="Call-out fee"
            hint="Shown to owners before they ask for an urgent visit. Blank for none."
            suffix={currency}
          />
        </div>
      </SectionCard>
      <SectionCard title="On every invoice" hint="Who the invoice is from, and what it says at the foot.">
        <TextField<SettingsFormValues>
          name="sellerName"
          label="Business name"
          maxLength={200}
          autoComplete="organization"
        />
        <TextAreaField<SettingsFormValues> name="sellerAddress" label="Address" rows={3} maxLength={500} />
        <TextField<SettingsFormValues>
          name="sellerTaxId"
          label="Tax number"
          hint="Your VAT, GST or other tax registration number, if you have one."
          maxLength={50}
          autoComplete="off"
          spellCheck={false}
        />
        <TextAreaField<SettingsFormValues>
          name="invoiceFooter"
          label="Invoice footer"
          hint="Bank details for transfers, and anything else every invoice should say."
          rows={4}
          maxLength={1000}
        />
      </SectionCard>
      <div className="grid gap-2">
        <FormProblem />
        {saved && (
          <p role="status" className="font-bold text-healthy-700">
            Saved. New invoices use these settings; the call-out fee shows on urgent requests from now on.
          </p>
        )}
        <SubmitButton pending="Saving…" className="sm:justify-self-end">
          Save settings
        </SubmitButton>
      </div>
    </Form>
  );
}
