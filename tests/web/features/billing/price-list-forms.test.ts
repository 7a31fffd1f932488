import { describe, expect, it } from 'vitest';
import type { BillingSettingsView, PriceItemView } from '@shared/schemas/billing';
import {
  bandSize,
  itemsOfKind,
  newPriceItemValues,
  priceItemFormSchema,
  priceItemValues,
  settingsFormSchema,
  settingsFormValues,
} from '../../../../web/features/billing/utils/price-list-forms';

const settings = (changes: Partial<BillingSettingsView> = {}): BillingSettingsView => ({
  currency: 'GBP',
  taxRateBp: 2000,
  taxLabel: 'VAT',
  pricesIncludeTax: true,
  paymentTermsDays: 14,
  hourlyRateMinor: 4500,
  callOutFeeMinor: null,
  sellerName: 'Sample Tank Care Co.',
  sellerAddress: '1 Example Street\nSampletown',
  sellerTaxId: '',
  invoiceFooter: 'Bank transfer to account 00000000, sort code 00-00-00.',
  currencyLocked: false,
  onlinePayment: false,
  ...changes,
});

const item = (changes: Partial<PriceItemView>): PriceItemView => ({
  id: crypto.randomUUID(),
  kind: 'consumable',
  name: 'Item',
  unit: 'each',
  unitPriceMinor: 100,
  upToLitres: null,
  archived: false,
  ...changes,
});

describe('the billing settings form', () => {
  it('shows stored amounts in the major unit and sends back what it was given', () => {
    const values = settingsFormValues(settings({ taxRateBp: 810, callOutFeeMinor: 8550 }));
    expect(values).toMatchObject({
      taxRate: '8.1',
      hourlyRate: '45.00',
      callOutFee: '85.50',
      paymentTermsDays: '14',
    });
    expect(settingsFormSchema.parse(values)).toMatchObject({
      taxRate: '8.1',
      hourlyRate: '45.00',
      callOutFee: '85.50',
      paymentTermsDays: 14,
    });
  });

  it('sends a blank hourly rate or call-out fee as none', () => {
    const input = settingsFormSchema.parse({
      ...settingsFormValues(settings()),
      hourlyRate: ' ',
      callOutFee: '',
    });
    expect(input.hourlyRate).toBeNull();
    expect(input.callOutFee).toBeNull();
  });

  it('writes yen without decimals and refuses them for it', () => {
    const yen = settingsFormValues(
      settings({ currency: 'JPY', hourlyRateMinor: 6000, callOutFeeMinor: null }),
    );
    expect(yen.hourlyRate).toBe('6000');
    const issues = settingsFormSchema.safeParse({ ...yen, callOutFee: '85.50' }).error!.issues;
    expect(issues).toEqual([
      expect.objectContaining({ path: ['callOutFee'], message: 'JPY has no decimals.' }),
    ]);
  });

  it('refuses terms that are not whole days from 0 to 120, against the field', () => {
    const values = settingsFormValues(settings());
    const late = settingsFormSchema.safeParse({ ...values, paymentTermsDays: '121' }).error!.issues;
    expect(late).toEqual([
      expect.objectContaining({ path: ['paymentTermsDays'], message: 'At most 120 days.' }),
    ]);
    const part = settingsFormSchema.safeParse({ ...values, paymentTermsDays: '7.5' }).error!.issues;
    expect(part).toEqual([
      expect.objectContaining({ path: ['paymentTermsDays'], message: 'Use whole days.' }),
    ]);
  });

  it('refuses a tax rate over 100 %', () => {
    const issues = settingsFormSchema.safeParse({ ...settingsFormValues(settings()), taxRate: '120' }).error!
      .issues;
    expect(issues).toEqual([expect.objectContaining({ path: ['taxRate'], message: 'At most 100 %.' })]);
  });
});

describe('a price-list item', () => {
  it('sends a routine band with its size, and blank size as the band for larger systems', () => {
    const schema = priceItemFormSchema('routine', 'GBP');
    const band = { ...newPriceItemValues('routine'), name: 'Routine service, small system', unitPrice: '65' };
    expect(schema.parse({ ...band, upToLitres: '250' })).toEqual({
      kind: 'routine',
      name: 'Routine service, small system',
      unit: 'visit',
      unitPrice: '65',
      upToLitres: 250,
    });
    expect(schema.parse(band).upToLitres).toBeNull();
  });

  it('never sends a size for a consumable or part', () => {
    const input = priceItemFormSchema('part', 'GBP').parse({
      name: 'Heater, 150 W',
      unit: 'each',
      unitPrice: '34.90',
      upToLitres: '300',
    });
    expect(input).toMatchObject({ kind: 'part', upToLitres: null });
  });

  it('says what is missing or wrong against each field', () => {
    const issues = priceItemFormSchema('consumable', 'GBP').safeParse({
      name: ' ',
      unit: '',
      unitPrice: '12.345',
      upToLitres: '',
    }).error!.issues;
    expect(issues.map((issue) => issue.path.join('.')).sort()).toEqual(['name', 'unit', 'unitPrice']);
  });

  it('takes whole yen only', () => {
    const schema = priceItemFormSchema('consumable', 'JPY');
    const values = { name: 'Filter sock', unit: 'sock', unitPrice: '450.50', upToLitres: '' };
    expect(schema.safeParse(values).error!.issues).toEqual([
      expect.objectContaining({ path: ['unitPrice'], message: 'JPY has no decimals.' }),
    ]);
    expect(schema.parse({ ...values, unitPrice: '450' }).unitPrice).toBe('450');
  });

  it('opens an item with its price in the major unit', () => {
    const band = item({ kind: 'routine', unit: 'visit', unitPriceMinor: 6500, upToLitres: 250 });
    expect(priceItemValues(band, 'GBP')).toEqual({
      name: 'Item',
      unit: 'visit',
      unitPrice: '65.00',
      upToLitres: '250',
    });
  });
});

describe('the price list’s groups', () => {
  it('orders bands by size with the open-ended band last, and leaves archived items out', () => {
    const items = [
      item({ kind: 'routine', name: 'Large', upToLitres: null }),
      item({ kind: 'routine', name: 'Medium', upToLitres: 600 }),
      item({ kind: 'routine', name: 'Small', upToLitres: 250 }),
      item({ kind: 'routine', name: 'Old', upToLitres: 100, archived: true }),
      item({ kind: 'consumable', name: 'Salt mix' }),
    ];
    expect(itemsOfKind(items, 'routine').map((band) => band.name)).toEqual(['Small', 'Medium', 'Large']);
    expect(itemsOfKind(items, 'part')).toEqual([]);
  });

  it('names a band by its size', () => {
    expect(bandSize(1200)).toBe('Up to 1,200 litres');
    expect(bandSize(null)).toBe('Larger systems');
  });
});
