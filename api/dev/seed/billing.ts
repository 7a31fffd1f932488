/*
 * The demo's billing: the company's price list (pounds, VAT included), and two invoices for the
 * Ashdown reef's latest routine services — the older one paid by bank transfer, the newer one
 * issued a few days ago and waiting to be paid online. They are written as issuing and paying would
 * have left them (numbers 1 and 2, events already announced), so seeding sends nothing. The price
 * list is keyed by `demoId` and written again in place; the invoices only on a company with none,
 * because issued invoices never change.
 */
import { and, desc, eq, sql } from 'drizzle-orm';
import { invoiceTotals, lineAmount } from '@shared/billing/money';
import { addDays } from '@shared/schemas/equipment';
import { visitKindLabels } from '@shared/visits/kinds';
import { formatDate } from '@shared/text/dates';
import { wallTimeOf } from '@shared/visits/recurrence';
import type { Db } from '../../db/client';
import {
  billingCounters,
  billingSettings,
  invoiceEvents,
  invoiceLines,
  invoices,
  payments,
  priceItems,
  visits,
} from '../../db/schema/index';
import { demoPeople } from '../demo-people';
import { demoId, demoTankId } from './ids';

const dayMs = 86_400_000;

export interface SeedBillingOptions {
  companyId: string;
  people: Map<string, string>;
  now: Date;
}

const settings = {
  currency: 'GBP',
  taxRateBp: 2000,
  taxLabel: 'VAT',
  pricesIncludeTax: true,
  paymentTermsDays: 14,
  hourlyRateMinor: 6000,
  callOutFeeMinor: 8500,
  sellerName: 'Driftglass Aquatic Care Ltd',
  sellerAddress: '14 Harbour Row\nExampleton EX1 2AB',
  sellerTaxId: 'GB 000 0000 00',
  invoiceFooter:
    'Bank transfer: Driftglass Aquatic Care Ltd, sort code 00-00-00, account 00000000 (demo details). Thank you for your custom.',
};

type Item = Pick<
  typeof priceItems.$inferInsert,
  'kind' | 'name' | 'unit' | 'unitPriceMinor' | 'upToLitres'
> & { key: string };

const items: Item[] = [
  {
    key: 'routine-150',
    kind: 'routine',
    name: 'Routine service, systems up to 150 L',
    unit: 'visit',
    unitPriceMinor: 5500,
    upToLitres: 150,
  },
  {
    key: 'routine-500',
    kind: 'routine',
    name: 'Routine service, systems up to 500 L',
    unit: 'visit',
    unitPriceMinor: 8500,
    upToLitres: 500,
  },
  {
    key: 'routine-1000',
    kind: 'routine',
    name: 'Routine service, systems up to 1,000 L',
    unit: 'visit',
    unitPriceMinor: 11500,
    upToLitres: 1000,
  },
  {
    key: 'routine-larger',
    kind: 'routine',
    name: 'Routine service, larger systems',
    unit: 'visit',
    unitPriceMinor: 14500,
    upToLitres: null,
  },
  {
    key: 'salt',
    kind: 'consumable',
    name: 'Reef salt mix, 20 kg bag',
    unit: 'bag',
    unitPriceMinor: 4200,
    upToLitres: null,
  },
  {
    key: 'socks',
    kind: 'consumable',
    name: 'Filter sock, 180 micron',
    unit: 'each',
    unitPriceMinor: 375,
    upToLitres: null,
  },
  {
    key: 'carbon',
    kind: 'consumable',
    name: 'Activated carbon, 500 ml',
    unit: 'pot',
    unitPriceMinor: 1450,
    upToLitres: null,
  },
  {
    key: 'epoxy',
    kind: 'consumable',
    name: 'Coral epoxy putty',
    unit: 'stick',
    unitPriceMinor: 899,
    upToLitres: null,
  },
  {
    key: 'ro-water',
    kind: 'consumable',
    name: 'RO water, 25 L',
    unit: 'container',
    unitPriceMinor: 600,
    upToLitres: null,
  },
  {
    key: 'heater',
    kind: 'part',
    name: 'Heater, 200 W',
    unit: 'each',
    unitPriceMinor: 3900,
    upToLitres: null,
  },
  {
    key: 'impeller',
    kind: 'part',
    name: 'Return pump impeller',
    unit: 'each',
    unitPriceMinor: 2400,
    upToLitres: null,
  },
  {
    key: 'float-switch',
    kind: 'part',
    name: 'Top-off float switch',
    unit: 'each',
    unitPriceMinor: 1800,
    upToLitres: null,
  },
];

const itemId = (key: string) => demoId(`price-item:${key}`);

export async function seedDemoBilling(db: Db, options: SeedBillingOptions): Promise<void> {
  const { companyId, people, now } = options;
  await db.transaction(async (tx) => {
    await tx
      .insert(billingSettings)
      .values({ companyId, ...settings })
      .onConflictDoUpdate({ target: billingSettings.companyId, set: settings });
    for (const { key, ...item } of items) {
      await tx
        .insert(priceItems)
        .values({ id: itemId(key), companyId, ...item })
        .onConflictDoUpdate({ target: priceItems.id, set: { ...item, archivedAt: null } });
    }
  });

  const [any] = await db
    .select({ id: invoices.id })
    .from(invoices)
    .where(eq(invoices.companyId, companyId))
    .limit(1);
  if (any) return;
  const tankId = demoTankId('ashdown-reef');
  const reports = await db
    .select({ id: visits.id, kind: visits.kind, windowStart: visits.windowStart })
    .from(visits)
    .where(and(eq(visits.tankId, tankId), eq(visits.status, 'published'), eq(visits.kind, 'routine')))
    .orderBy(desc(visits.windowStart))
    .limit(2);
  const helen = people.get('u-helen');
  const owner = demoPeople.find((person) => person.sub === 'u-helen')!;
  const mara = people.get('u-mara');
  if (reports.length < 2 || !helen) return;
  const zone = 'Europe/London';
  const today = wallTimeOf(now, zone).day;

  const plans = [
    {
      visit: reports[1]!,
      number: 1,
      issuedDaysAgo: 17,
      paidDaysAgo: 9,
      extras: [
        ['socks', 400],
        ['carbon', 100],
      ] as const,
    },
    {
      visit: reports[0]!,
      number: 2,
      issuedDaysAgo: 3,
      paidDaysAgo: null,
      extras: [
        ['socks', 400],
        ['salt', 100],
        ['epoxy', 100],
      ] as const,
    },
  ];
  await db.transaction(async (tx) => {
    for (const plan of plans) {
      const band = items.find((item) => item.key === 'routine-500')!;
      const lines = [
        {
          kind: 'service' as const,
          description: `${band.name} — ${formatDate(plan.visit.windowStart, zone)}`,
          quantityHundredths: 100,
          unit: band.unit,
          unitPriceMinor: band.unitPriceMinor,
          priceItemId: itemId(band.key),
        },
        ...plan.extras.map(([key, hundredths]) => {
          const item = items.find((entry) => entry.key === key)!;
          return {
            kind: item.kind === 'part' ? ('part' as const) : ('consumable' as const),
            description: item.name,
            quantityHundredths: hundredths,
            unit: item.unit,
            unitPriceMinor: item.unitPriceMinor,
            priceItemId: itemId(key),
          };
        }),
      ].map((line) => ({ ...line, amountMinor: lineAmount(line.quantityHundredths, line.unitPriceMinor) }));
      const totals = invoiceTotals(
        lines.map((line) => line.amountMinor),
        settings.taxRateBp,
        settings.pricesIncludeTax,
      );
      const issueDate = addDays(today, -plan.issuedDaysAgo);
      const issuedAt = new Date(now.getTime() - plan.issuedDaysAgo * dayMs);
      const paidAt = plan.paidDaysAgo === null ? null : new Date(now.getTime() - plan.paidDaysAgo * dayMs);
      const id = demoId(`invoice:${plan.number}`);
      await tx.insert(invoices).values({
        id,
        companyId,
        tankId,
        status: paidAt ? 'paid' : 'issued',
        number: plan.number,
        sourceVisitId: plan.visit.id,
        billToUserId: helen,
        billToName: owner.name,
        billToEmail: owner.email,
        currency: settings.currency,
        taxRateBp: settings.taxRateBp,
        taxLabel: settings.taxLabel,
        pricesIncludeTax: settings.pricesIncludeTax,
        ...totals,
        paidMinor: paidAt ? totals.totalMinor : 0,
        note: `${visitKindLabels[plan.visit.kind]} as reported.`,
        seller: {
          name: settings.sellerName,
          address: settings.sellerAddress,
          taxId: settings.sellerTaxId,
          footer: settings.invoiceFooter,
        },
        issueDate,
        dueDate: addDays(issueDate, settings.paymentTermsDays),
        issuedAt,
        issuedBy: mara ?? null,
        paidAt,
        createdBy: mara ?? null,
        createdAt: issuedAt,
      });
      await tx
        .insert(invoiceLines)
        .values(lines.map((line, position) => ({ ...line, invoiceId: id, position })));
      await tx.insert(invoiceEvents).values({ invoiceId: id, type: 'issued', announcedAt: issuedAt });
      if (paidAt) {
        await tx.insert(payments).values({
          companyId,
          invoiceId: id,
          method: 'bank-transfer',
          amountMinor: totals.totalMinor,
          currency: settings.currency,
          receivedAt: paidAt,
          reference: 'ASHDOWN REEF',
          recordedBy: mara ?? null,
        });
        await tx.insert(invoiceEvents).values({ invoiceId: id, type: 'paid', announcedAt: paidAt });
      }
    }
    await tx
      .insert(billingCounters)
      .values({ companyId, kind: 'invoice', lastNumber: plans.length })
      .onConflictDoUpdate({
        target: [billingCounters.companyId, billingCounters.kind],
        set: { lastNumber: sql`greatest(${billingCounters.lastNumber}, ${plans.length})` },
      });
  });
}
