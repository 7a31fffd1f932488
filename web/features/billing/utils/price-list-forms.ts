import { z } from 'zod';
import { type PriceItemKind } from '@shared/billing/invoices';
import { minorToText, parseMoney, quantityToText } from '@shared/billing/money';
import {
  billingSettingsInput,
  moneyText,
  priceItemInput,
  type BillingSettingsView,
  type PriceItemView,
} from '@shared/schemas/billing';
import { formatCount } from '../../../lib/format';
import { blankAsNull, decimalDefault, decimalText } from '../../../lib/form-values';

/*
 * The price list as the screen holds it: money as typed in the major unit ("12.50"), the tax rate
 * in percent, days and litres as text. The shared schemas check the shape; the amounts are also read
 * for the currency chosen (a currency without a minor unit takes no decimals), as the server will.
 */

const fields = billingSettingsInput.shape;

/** Blank is "none"; otherwise an amount the currency can hold. */
const optionalMoney = blankAsNull(moneyText.nullable());

function checkMoney(text: string | null, currency: string, path: string, context: z.RefinementCtx): void {
  if (text === null) return;
  const parsed = parseMoney(text, currency);
  if (!parsed.ok) context.addIssue({ code: 'custom', path: [path], message: parsed.message });
}

export const settingsFormSchema = z
  .object({
    currency: fields.currency,
    taxLabel: fields.taxLabel,
    taxRate: fields.taxRate,
    pricesIncludeTax: fields.pricesIncludeTax,
    paymentTermsDays: decimalText(
      z.int('Use whole days.').min(0, 'At least 0 days.').max(120, 'At most 120 days.'),
    ),
    hourlyRate: optionalMoney,
    callOutFee: optionalMoney,
    sellerName: fields.sellerName,
    sellerAddress: fields.sellerAddress,
    sellerTaxId: fields.sellerTaxId,
    invoiceFooter: fields.invoiceFooter,
  })
  .superRefine((form, context) => {
    checkMoney(form.hourlyRate, form.currency, 'hourlyRate', context);
    checkMoney(form.callOutFee, form.currency, 'callOutFee', context);
  })
  .pipe(billingSettingsInput);

export type SettingsFormValues = z.input<typeof settingsFormSchema>;

const moneyDefault = (minor: number | null, currency: string) =>
  minor === null ? '' : minorToText(minor, currency);

export function settingsFormValues(settings: BillingSettingsView): SettingsFormValues {
  return {
    currency: settings.currency,
    taxLabel: settings.taxLabel,
    // Basis points are hundredths of a percent, written as a quantity is: 2000 → "20", 810 → "8.1".
    taxRate: quantityToText(settings.taxRateBp),
    pricesIncludeTax: settings.pricesIncludeTax,
    paymentTermsDays: String(settings.paymentTermsDays),
    hourlyRate: moneyDefault(settings.hourlyRateMinor, settings.currency),
    callOutFee: moneyDefault(settings.callOutFeeMinor, settings.currency),
    sellerName: settings.sellerName,
    sellerAddress: settings.sellerAddress,
    sellerTaxId: settings.sellerTaxId,
    invoiceFooter: settings.invoiceFooter,
  };
}

/** One price-list item of a kind the screen already knows, priced in the company's currency. */
export function priceItemFormSchema(kind: PriceItemKind, currency: string) {
  return z
    .object({
      name: z.string(),
      unit: z.string(),
      unitPrice: z.string(),
      // Routine bands only: blank is the band for every larger system.
      upToLitres: decimalText(
        z
          .int('Use whole litres.')
          .min(1, 'At least 1 litre.')
          .max(1_000_000, 'At most 1,000,000 litres.')
          .optional(),
      ).transform((litres) => (kind === 'routine' ? (litres ?? null) : null)),
    })
    .superRefine((form, context) => {
      if (moneyText.safeParse(form.unitPrice).success) {
        checkMoney(form.unitPrice, currency, 'unitPrice', context);
      }
    })
    .transform((form): z.input<typeof priceItemInput> => ({ kind, ...form }))
    .pipe(priceItemInput);
}

export type PriceItemFormValues = z.input<ReturnType<typeof priceItemFormSchema>>;

/** What a new item of each kind starts with: the unit most items of that kind are sold by. */
export function newPriceItemValues(kind: PriceItemKind): PriceItemFormValues {
  return {
    name: '',
    unit: kind === 'routine' ? 'visit' : kind === 'part' ? 'each' : '',
    unitPrice: '',
    upToLitres: '',
  };
}

export function priceItemValues(item: PriceItemView, currency: string): PriceItemFormValues {
  return {
    name: item.name,
    unit: item.unit,
    unitPrice: minorToText(item.unitPriceMinor, currency),
    upToLitres: decimalDefault(item.upToLitres),
  };
}

/** Routine bands by size, smallest first, the open-ended band last; the others by name. */
export function itemsOfKind(items: readonly PriceItemView[], kind: PriceItemKind): PriceItemView[] {
  const ofKind = items.filter((item) => item.kind === kind && !item.archived);
  if (kind !== 'routine') return ofKind.sort((a, b) => a.name.localeCompare(b.name));
  return ofKind.sort(
    (a, b) => (a.upToLitres ?? Number.POSITIVE_INFINITY) - (b.upToLitres ?? Number.POSITIVE_INFINITY),
  );
}

/** "Up to 200 litres", or "Larger systems" for the band without an upper size. */
export const bandSize = (upToLitres: number | null) =>
  upToLitres === null ? 'Larger systems' : `Up to ${formatCount(upToLitres)} litres`;
