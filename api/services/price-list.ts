import { and, asc, eq, isNull, ne, sql } from 'drizzle-orm';
import { minorDigits, parseMoney, type Currency } from '@shared/billing/money';
import type {
  BillingSettingsInput,
  BillingSettingsView,
  PriceItemInput,
  PriceItemView,
  PriceListView,
} from '@shared/schemas/billing';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import { billingSettings, invoices, priceItems } from '../db/schema/index';
import { badRequest, conflict, notFound, type ErrorIssue } from '../lib/http-error';
import type { Actor } from './actors';
import { recordAudit, type AuditSource } from './audit';

/*
 * The company's price list: currency, tax, terms, the hourly rate and call-out fee (billing_settings),
 * and routine service by tank size, consumables and parts (price_items). Invoices are drafted from it.
 */

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type SettingsRow = typeof billingSettings.$inferSelect;
type ItemRow = typeof priceItems.$inferSelect;

const defaults = {
  currency: 'EUR',
  taxRateBp: 0,
  taxLabel: 'VAT',
  pricesIncludeTax: true,
  paymentTermsDays: 14,
  hourlyRateMinor: null,
  callOutFeeMinor: null,
  sellerName: '',
  sellerAddress: '',
  sellerTaxId: '',
  invoiceFooter: '',
} satisfies Omit<SettingsRow, 'companyId' | 'createdAt' | 'updatedAt'>;

export type BillingSettings = Omit<SettingsRow, 'companyId' | 'createdAt' | 'updatedAt' | 'currency'> & {
  currency: Currency;
};

/** The company's billing settings, or the defaults when it never set any. */
export async function billingSettingsOf(db: Db | Tx, companyId: string): Promise<BillingSettings> {
  const [row] = await db.select().from(billingSettings).where(eq(billingSettings.companyId, companyId));
  if (!row) return { ...defaults } as BillingSettings;
  const { companyId: _company, createdAt: _created, updatedAt: _updated, ...settings } = row;
  return settings as BillingSettings;
}

/** The fee an urgent request carries: what the owner is shown before sending it. */
export async function callOutFeeOf(db: Db | Tx, companyId: string) {
  const { callOutFeeMinor, currency } = await billingSettingsOf(db, companyId);
  return { callOutFeeMinor, currency };
}

async function currencyLocked(db: Db | Tx, companyId: string): Promise<boolean> {
  const [used] = await db
    .select({ one: sql`1` })
    .from(invoices)
    .where(and(eq(invoices.companyId, companyId), ne(invoices.status, 'draft')))
    .limit(1);
  return Boolean(used);
}

function settingsView(
  settings: BillingSettings,
  locked: boolean,
  onlinePayment: boolean,
): BillingSettingsView {
  return { ...settings, currencyLocked: locked, onlinePayment };
}

function itemView(row: ItemRow): PriceItemView {
  return {
    id: row.id,
    kind: row.kind,
    name: row.name,
    unit: row.unit,
    unitPriceMinor: row.unitPriceMinor,
    upToLitres: row.upToLitres,
    archived: row.archivedAt !== null,
  };
}

export async function getPriceList(deps: AppDeps, actor: Actor): Promise<PriceListView> {
  const { db } = deps;
  const [settings, locked, items] = await Promise.all([
    billingSettingsOf(db, actor.companyId),
    currencyLocked(db, actor.companyId),
    db
      .select()
      .from(priceItems)
      .where(eq(priceItems.companyId, actor.companyId))
      .orderBy(
        sql`${priceItems.archivedAt} is not null`,
        sql`case ${priceItems.kind} when 'routine' then 0 when 'consumable' then 1 else 2 end`,
        sql`${priceItems.upToLitres} asc nulls last`,
        asc(priceItems.name),
      ),
  ]);
  return {
    settings: settingsView(settings, locked, deps.payments !== null),
    items: items.map(itemView),
  };
}

/** Money text for the company's currency, or a 400 naming the field. */
export function moneyOf(
  text: string,
  currency: string,
  path: string,
  options: { allowNegative?: boolean } = {},
) {
  const parsed = parseMoney(text, currency, options);
  if (!parsed.ok) throw invalidMoney([{ path, message: parsed.message }]);
  return parsed.minor;
}

const invalidMoney = (issues: ErrorIssue[]) =>
  badRequest('invalid_request', 'Some amounts are not valid.', issues);

/** "20" or "8,1" percent to basis points; the schema already checked the form. */
const basisPoints = (text: string) => Math.round(Number(text.replace(',', '.')) * 100);

export async function saveBillingSettings(
  deps: AppDeps,
  actor: Actor,
  input: BillingSettingsInput,
  source: AuditSource,
): Promise<BillingSettingsView> {
  const values = {
    currency: input.currency,
    taxRateBp: basisPoints(input.taxRate),
    taxLabel: input.taxLabel,
    pricesIncludeTax: input.pricesIncludeTax,
    paymentTermsDays: input.paymentTermsDays,
    hourlyRateMinor:
      input.hourlyRate === null ? null : moneyOf(input.hourlyRate, input.currency, 'body.hourlyRate'),
    callOutFeeMinor:
      input.callOutFee === null ? null : moneyOf(input.callOutFee, input.currency, 'body.callOutFee'),
    sellerName: input.sellerName,
    sellerAddress: input.sellerAddress,
    sellerTaxId: input.sellerTaxId,
    invoiceFooter: input.invoiceFooter,
  };
  return deps.db.transaction(async (tx) => {
    // One company's settings change one at a time, so the currency check below cannot race an issue.
    await tx.execute(
      sql`select pg_advisory_xact_lock(hashtext('billing-settings'), hashtext(${actor.companyId}))`,
    );
    const before = await billingSettingsOf(tx, actor.companyId);
    const locked = await currencyLocked(tx, actor.companyId);
    if (values.currency !== before.currency) {
      if (locked) {
        throw conflict(
          'currency_locked',
          `Invoices were issued in ${before.currency}, so the currency stays ${before.currency}.`,
        );
      }
      const [priced] = await tx
        .select({ one: sql`1` })
        .from(priceItems)
        .where(and(eq(priceItems.companyId, actor.companyId), isNull(priceItems.archivedAt)))
        .limit(1);
      if (priced && minorDigits(values.currency) !== minorDigits(before.currency)) {
        throw conflict(
          'currency_locked',
          `The price list has prices in ${before.currency}, which has a different number of decimals; archive them first.`,
        );
      }
    }
    await tx
      .insert(billingSettings)
      .values({ companyId: actor.companyId, ...values })
      .onConflictDoUpdate({ target: billingSettings.companyId, set: values });
    await recordAudit(tx, {
      companyId: actor.companyId,
      actor,
      action: 'billing-settings.changed',
      before,
      after: values,
      source,
    });
    return settingsView({ ...before, ...values } as BillingSettings, locked, deps.payments !== null);
  });
}

async function checkedItem(db: Db | Tx, companyId: string, input: PriceItemInput, currency: string) {
  const unitPriceMinor = moneyOf(input.unitPrice, currency, 'body.unitPrice');
  if (input.kind === 'routine' && input.upToLitres !== null) {
    const [clash] = await db
      .select({ id: priceItems.id })
      .from(priceItems)
      .where(
        and(
          eq(priceItems.companyId, companyId),
          eq(priceItems.kind, 'routine'),
          eq(priceItems.upToLitres, input.upToLitres),
          isNull(priceItems.archivedAt),
        ),
      )
      .limit(1);
    if (clash) return { unitPriceMinor, clashId: clash.id };
  }
  return { unitPriceMinor, clashId: null };
}

export async function createPriceItem(
  deps: AppDeps,
  actor: Actor,
  input: PriceItemInput,
): Promise<PriceItemView> {
  const { currency } = await billingSettingsOf(deps.db, actor.companyId);
  const { unitPriceMinor, clashId } = await checkedItem(deps.db, actor.companyId, input, currency);
  if (clashId)
    throw conflict('band_taken', `A routine band up to ${input.upToLitres} litres is already priced.`);
  const [row] = await deps.db
    .insert(priceItems)
    .values({
      companyId: actor.companyId,
      kind: input.kind,
      name: input.name,
      unit: input.unit,
      unitPriceMinor,
      upToLitres: input.upToLitres,
    })
    .returning();
  return itemView(row!);
}

export async function updatePriceItem(
  deps: AppDeps,
  actor: Actor,
  priceItemId: string,
  input: PriceItemInput,
): Promise<PriceItemView> {
  const { currency } = await billingSettingsOf(deps.db, actor.companyId);
  const { unitPriceMinor, clashId } = await checkedItem(deps.db, actor.companyId, input, currency);
  if (clashId && clashId !== priceItemId) {
    throw conflict('band_taken', `A routine band up to ${input.upToLitres} litres is already priced.`);
  }
  const [row] = await deps.db
    .update(priceItems)
    .set({
      kind: input.kind,
      name: input.name,
      unit: input.unit,
      unitPriceMinor,
      upToLitres: input.upToLitres,
    })
    .where(and(eq(priceItems.id, priceItemId), eq(priceItems.companyId, actor.companyId)))
    .returning();
  if (!row) throw notFound('price-list item');
  return itemView(row);
}

/** Archived, never deleted: drafts and reports that name it keep reading. */
export async function archivePriceItem(deps: AppDeps, actor: Actor, priceItemId: string): Promise<void> {
  const [row] = await deps.db
    .update(priceItems)
    .set({ archivedAt: deps.clock() })
    .where(
      and(
        eq(priceItems.id, priceItemId),
        eq(priceItems.companyId, actor.companyId),
        isNull(priceItems.archivedAt),
      ),
    )
    .returning({ id: priceItems.id });
  if (!row) throw notFound('price-list item');
}

/** The routine band that fits a system of this many litres: the smallest band it fits, else the open-ended one. */
export function routineBandFor<T extends { upToLitres: number | null }>(
  bands: readonly T[],
  litres: number,
): T | null {
  const sorted = [...bands].sort((a, b) => (a.upToLitres ?? Infinity) - (b.upToLitres ?? Infinity));
  return sorted.find((band) => band.upToLitres === null || litres <= band.upToLitres) ?? null;
}
