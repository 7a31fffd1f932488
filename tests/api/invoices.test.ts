import { and, eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatMoney } from '@shared/billing/money';
import type {
  BillingSettingsView,
  InvoiceDetail,
  InvoiceLineInput,
  InvoicePage,
  PriceItemView,
  PriceListView,
} from '@shared/schemas/billing';
import type { UrgentRequestView, UrgentSettingsView } from '@shared/schemas/urgent-requests';
import type { VisitDetail, VisitReportInput, VisitSummary } from '@shared/schemas/visits';
import { parseCsv } from '@shared/readings/csv';
import { addDays } from '@shared/schemas/equipment';
import { formatDate } from '@shared/text/dates';
import { wallInstant, wallTimeOf } from '@shared/visits/recurrence';
import type { CapturedMail } from '../../api/dev/mail-server';
import {
  auditEvents,
  billingCounters,
  deliveries,
  invoiceEvents,
  invoiceLines,
  invoices,
  notifications,
  payments,
  type tanks,
} from '../../api/db/schema/index';
import { invoiceCsvColumns, paymentCsvColumns } from '../../api/services/billing-exports';
import { sweepOverdueInvoices } from '../../api/services/invoices';
import { issuePaths, signedIn, type ApiAnswer, type ApiSession } from '../helpers/api-session';
import { createTestClock } from '../helpers/clock';
import { createCompany, createPerson, createTank, type TestPerson } from '../helpers/factories';
import { readPdf } from '../helpers/pdf-text';
import { startTestStack, type TestStack } from '../helpers/stack';

type Tank = typeof tanks.$inferSelect;
type ErrorBody = { error: { code: string; message: string; issues?: { path: string; message: string }[] } };
type Detail = InvoiceDetail & ErrorBody;

const london = 'Europe/London';
/** Today on the company's calendar (London). */
const today = () => wallTimeOf(new Date(), london).day;
const minutesAgo = (n: number) => new Date(Date.now() - n * 60_000).toISOString();

/** The company's billing settings as an admin types them: GBP, 20 % VAT included in the prices. */
const settingsInput = (fields: Record<string, unknown> = {}) => ({
  currency: 'GBP',
  taxRate: '20',
  taxLabel: 'VAT',
  pricesIncludeTax: true,
  paymentTermsDays: 14,
  hourlyRate: '60.00',
  callOutFee: '85.00',
  sellerName: 'Harbourside Aquatic Care Ltd',
  sellerAddress: '4 Quay Street, Exampleton',
  sellerTaxId: 'GB 000 0000 00',
  invoiceFooter: 'Pay by bank transfer to sort code 00-00-00, account 00000000.',
  ...fields,
});

const line = (
  fields: Partial<InvoiceLineInput> & { description: string; unitPrice: string },
): InvoiceLineInput => ({
  kind: 'other',
  quantity: '1',
  unit: '',
  priceItemId: null,
  ...fields,
});

/*
 * The hand-checked example (the same figures as tests/shared/billing/money.test.ts):
 *   1 × 95.00 + 4 × 3.75 + 1 × 8.99 + 1.25 × 60.00 = 95.00 + 15.00 + 8.99 + 75.00 = 193.99
 *   20 % included: net = 193.99 / 1.2 = 161.658… → 161.66, tax = 193.99 − 161.66 = 32.33.
 */
const workedExample = [
  line({ kind: 'service', description: 'Routine service up to 500 L', unit: 'visit', unitPrice: '95.00' }),
  line({ kind: 'consumable', description: 'Filter floss', quantity: '4', unit: 'roll', unitPrice: '3.75' }),
  line({ kind: 'consumable', description: 'Activated carbon', unit: 'bag', unitPrice: '8.99' }),
  line({ kind: 'labour', description: 'Time on site', quantity: '1.25', unit: 'hour', unitPrice: '60.00' }),
];

describe('billing: price list, invoices, credit notes and payments', () => {
  let stack: TestStack;
  let companyId: string;
  let otherCompanyId: string;
  let people: Record<'ada' | 'tess' | 'olive' | 'colin' | 'nina' | 'formula' | 'far', TestPerson>;
  let ada: ApiSession;
  let tess: ApiSession;
  let olive: ApiSession;
  let nina: ApiSession;
  let otherAdmin: ApiSession;
  let reef: Tank;
  let neighbour: Tank;
  let formulaTank: Tank;
  let foreignTank: Tank;
  let items: Record<'small' | 'medium' | 'large' | 'floss' | 'carbon' | 'heater', PriceItemView>;

  beforeAll(async () => {
    stack = await startTestStack();
    const { db } = stack.database;
    const issuer = stack.idp.issuer;
    companyId = (await createCompany(db, { timeZone: london, name: 'Harbourside Aquatic Care' })).id;
    otherCompanyId = (await createCompany(db)).id;
    const person = (role: TestPerson['role'], name: string, company = companyId) =>
      createPerson(db, { companyId: company, role, issuer, name });
    people = {
      ada: await person('admin', 'Ada Admin'),
      tess: await person('technician', 'Tess Tech'),
      olive: await person('owner', 'Olive Owner'),
      colin: await person('owner', 'Colin Co-owner'),
      nina: await person('owner', 'Nina Neighbour'),
      // A client whose name a spreadsheet would run as a formula.
      formula: await person('owner', '=HYPERLINK("https://example.test","Pay here")'),
      far: await person('owner', 'Faye Faraway', otherCompanyId),
    };
    ada = await signedIn(stack, people.ada);
    tess = await signedIn(stack, people.tess);
    olive = await signedIn(stack, people.olive);
    nina = await signedIn(stack, people.nina);
    otherAdmin = await signedIn(stack, await person('admin', 'Other Admin', otherCompanyId));
    // 300 L display + 100 L sump: the 500 L routine band.
    reef = await createTank(db, {
      companyId,
      name: 'Lobby reef',
      style: 'mixed-reef',
      waterType: 'marine',
      displayVolumeL: 300,
      sumpVolumeL: 100,
      setUpOn: '2020-01-01',
      timeZone: london,
      owners: [people.olive, people.colin],
    });
    neighbour = await createTank(db, { companyId, name: 'Next door', owners: [people.nina] });
    formulaTank = await createTank(db, { companyId, name: 'Office tank', owners: [people.formula] });
    foreignTank = await createTank(db, {
      companyId: otherCompanyId,
      name: 'Elsewhere',
      owners: [people.far],
    });

    const settings = await ada.put<BillingSettingsView & ErrorBody>('/api/billing/settings', settingsInput());
    expect(settings.status, JSON.stringify(settings.body)).toBe(200);
    const add = async (body: Record<string, unknown>) => {
      const res = await ada.post<PriceItemView & ErrorBody>('/api/billing/price-items', body);
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      return res.body;
    };
    items = {
      large: await add({
        kind: 'routine',
        name: 'Routine service, larger systems',
        unit: 'visit',
        unitPrice: '140',
        upToLitres: null,
      }),
      medium: await add({
        kind: 'routine',
        name: 'Routine service up to 500 L',
        unit: 'visit',
        unitPrice: '95.00',
        upToLitres: 500,
      }),
      small: await add({
        kind: 'routine',
        name: 'Routine service up to 200 L',
        unit: 'visit',
        unitPrice: '65,00',
        upToLitres: 200,
      }),
      floss: await add({ kind: 'consumable', name: 'Filter floss', unit: 'roll', unitPrice: '3.75' }),
      carbon: await add({ kind: 'consumable', name: 'Activated carbon', unit: 'bag', unitPrice: '8.99' }),
      heater: await add({ kind: 'part', name: 'Heater 200 W', unit: 'each', unitPrice: '34.50' }),
    };
  });
  afterAll(() => stack?.close());

  /* ------------------------------------------------------------------ helpers */

  const invoicePath = (id: string, rest = '') => `/api/invoices/${id}${rest}`;

  /** The answer's body, once its status is the one expected. */
  async function ok<T = unknown>(answer: Promise<ApiAnswer>, status = 200): Promise<T> {
    const res = await answer;
    expect(res.status, JSON.stringify(res.body)).toBe(status);
    return res.body as T;
  }

  /** A blank draft for the tank, then its lines and bill-to saved. */
  async function drafted(
    lines: InvoiceLineInput[] = workedExample,
    tank: Tank = reef,
    billTo: TestPerson | null = people.olive,
  ) {
    const blank = await ok<InvoiceDetail>(ada.post('/api/invoices', { tankId: tank.id }), 201);
    return ok<InvoiceDetail>(
      ada.put(invoicePath(blank.id), {
        version: blank.version,
        billToUserId: billTo?.id ?? null,
        note: '',
        lines,
      }),
    );
  }

  async function issued(
    lines: InvoiceLineInput[] = workedExample,
    tank: Tank = reef,
    billTo: TestPerson = people.olive,
  ) {
    const draft = await drafted(lines, tank, billTo);
    return ok<InvoiceDetail>(ada.post(invoicePath(draft.id, '/issue'), { version: draft.version }));
  }

  /** A payment recorded by an admin, received today; the caller checks the answer. */
  const recordPayment = (invoiceId: string, amount: string, method = 'cash', reference = '') =>
    ada.post<ErrorBody>(invoicePath(invoiceId, '/payments'), {
      method,
      amount,
      receivedOn: today(),
      reference,
    });

  /** Two issued invoices of the worked example: one paid in full in cash, one cancelled. */
  async function paidAndVoided() {
    const paid = await issued();
    await ok(recordPayment(paid.id, '193.99'));
    const voided = await issued();
    await ok(ada.post(invoicePath(voided.id, '/void'), { reason: 'Duplicate.' }));
    return { paid, voided };
  }

  const invoiceRow = async (id: string) =>
    (await stack.database.db.select().from(invoices).where(eq(invoices.id, id)))[0]!;

  const eventsOf = (invoiceId: string) =>
    stack.database.db.select().from(invoiceEvents).where(eq(invoiceEvents.invoiceId, invoiceId));

  async function deliveriesOf(invoiceId: string) {
    const events = await eventsOf(invoiceId);
    if (events.length === 0) return [];
    return stack.database.db
      .select()
      .from(deliveries)
      .where(
        inArray(
          deliveries.invoiceEventId,
          events.map((event) => event.id),
        ),
      );
  }

  const mailsAbout = (number: string | null) =>
    stack.mail.messages().filter((mail) => number !== null && mail.subject.includes(number));

  async function lastNumber(kind: 'invoice' | 'credit-note') {
    const [row] = await stack.database.db
      .select({ last: billingCounters.lastNumber })
      .from(billingCounters)
      .where(and(eq(billingCounters.companyId, companyId), eq(billingCounters.kind, kind)));
    return row?.last ?? 0;
  }

  /** A visit of the reef scheduled today, its report saved and published by the technician. */
  async function publishedVisit(kind: string, content: VisitReportInput, publish = true) {
    const visit = await ok<VisitSummary>(
      tess.post('/api/visits', {
        tankId: reef.id,
        kind,
        date: today(),
        startTime: '09:00',
        endTime: '10:30',
      }),
      201,
    );
    const current = await ok<VisitDetail>(tess.get(`/api/visits/${visit.id}`));
    const saved = await ok<VisitDetail>(
      tess.put(`/api/visits/${visit.id}/report`, { version: current.version, content }),
    );
    if (publish)
      await ok<VisitDetail>(tess.post(`/api/visits/${visit.id}/publish`, { version: saved.version }));
    return visit;
  }

  const refillUrgentBudgets = () =>
    stack.database.pool.query(`delete from rate_limits where key like 'urgent-request:%'`);

  /** An owner's urgent request, accepting the fee now in force. */
  async function urgentRequest(acceptedCallOutFeeCents: number | null) {
    await refillUrgentBudgets();
    return ok<UrgentRequestView>(
      olive.post(`/api/tanks/${reef.id}/urgent-requests`, {
        category: 'leak',
        description: 'Water is dripping from the sump onto the floor.',
        someoneOnSite: true,
        phone: '+44 20 7946 0958',
        acceptedCallOutFeeCents,
      }),
      201,
    );
  }

  /* ------------------------------------------------------------------ price list */

  describe('price list and billing settings', () => {
    it('gives staff the settings and the items: routine bands smallest first, then consumables and parts', async () => {
      const list = await ok<PriceListView>(tess.get('/api/billing/price-list'));

      expect(list.settings).toMatchObject({
        currency: 'GBP',
        taxRateBp: 2000,
        taxLabel: 'VAT',
        pricesIncludeTax: true,
        paymentTermsDays: 14,
        hourlyRateMinor: 6000,
        callOutFeeMinor: 8500,
        sellerName: 'Harbourside Aquatic Care Ltd',
        currencyLocked: false,
        onlinePayment: true,
      });
      expect(list.items.map((item) => [item.name, item.unitPriceMinor, item.upToLitres])).toEqual([
        ['Routine service up to 200 L', 6500, 200],
        ['Routine service up to 500 L', 9500, 500],
        ['Routine service, larger systems', 14000, null],
        ['Activated carbon', 899, null],
        ['Filter floss', 375, null],
        ['Heater 200 W', 3450, null],
      ]);
    });

    it('lets technicians read the price list but not change it, and keeps owners out of it', async () => {
      const item = { kind: 'consumable', name: 'Phosphate remover', unit: 'pot', unitPrice: '12.00' };
      const refusals = [
        await tess.put<ErrorBody>('/api/billing/settings', settingsInput({ callOutFee: '1.00' })),
        await tess.post<ErrorBody>('/api/billing/price-items', item),
        await tess.put<ErrorBody>(`/api/billing/price-items/${items.floss.id}`, { ...item, name: 'Floss' }),
        await tess.delete<ErrorBody>(`/api/billing/price-items/${items.floss.id}`),
        await olive.get<ErrorBody>('/api/billing/price-list'),
        await olive.put<ErrorBody>('/api/billing/settings', settingsInput()),
        await olive.post<ErrorBody>('/api/billing/price-items', item),
      ];

      expect(refusals.map((res) => [res.status, res.body.error.code])).toEqual(
        refusals.map(() => [403, 'forbidden']),
      );
      const list = await ok<PriceListView>(ada.get('/api/billing/price-list'));
      expect(list.settings.callOutFeeMinor).toBe(8500);
      expect(list.items.map((i) => i.name)).not.toContain('Phosphate remover');
      expect(list.items.find((i) => i.id === items.floss.id)).toMatchObject({
        name: 'Filter floss',
        archived: false,
      });
    });

    it('refuses money with three decimals or a minus sign, naming the field', async () => {
      const threeDecimals = await ada.post<ErrorBody>('/api/billing/price-items', {
        kind: 'consumable',
        name: 'Salt',
        unit: 'bucket',
        unitPrice: '3.755',
      });
      const negative = await ada.post<ErrorBody>('/api/billing/price-items', {
        kind: 'consumable',
        name: 'Salt',
        unit: 'bucket',
        unitPrice: '-3.75',
      });
      const settings = await ada.put<ErrorBody>(
        '/api/billing/settings',
        settingsInput({ hourlyRate: '60.001', callOutFee: '-85.00' }),
      );

      expect([threeDecimals.status, negative.status, settings.status]).toEqual([400, 400, 400]);
      expect(issuePaths(threeDecimals.body)).toEqual(['body.unitPrice']);
      expect(issuePaths(negative.body)).toEqual(['body.unitPrice']);
      expect(issuePaths(settings.body)).toEqual(['body.callOutFee', 'body.hourlyRate']);
      const list = await ok<PriceListView>(ada.get('/api/billing/price-list'));
      expect(list.items.map((i) => i.name)).not.toContain('Salt');
      expect(list.settings).toMatchObject({ hourlyRateMinor: 6000, callOutFeeMinor: 8500 });
    });

    it('refuses a second routine band for the same size (409 band_taken) and a size on anything else (400)', async () => {
      const taken = await ada.post<ErrorBody>('/api/billing/price-items', {
        kind: 'routine',
        name: 'Another 500 L band',
        unit: 'visit',
        unitPrice: '90.00',
        upToLitres: 500,
      });
      const sized = await ada.post<ErrorBody>('/api/billing/price-items', {
        kind: 'part',
        name: 'Return pump',
        unit: 'each',
        unitPrice: '150.00',
        upToLitres: 500,
      });

      expect(taken.status).toBe(409);
      expect(taken.body.error.code).toBe('band_taken');
      expect(sized.status).toBe(400);
      expect(issuePaths(sized.body)).toEqual(['body.upToLitres']);
    });

    it('changes a price, archives an item (listed last), and keeps another company’s admin out', async () => {
      const made = await ok<PriceItemView>(
        ada.post('/api/billing/price-items', {
          kind: 'consumable',
          name: 'Aardvark test kit',
          unit: 'kit',
          unitPrice: '20',
        }),
        201,
      );
      const changed = await ok<PriceItemView>(
        ada.put(`/api/billing/price-items/${made.id}`, {
          kind: 'consumable',
          name: 'Aardvark test kit',
          unit: 'kit',
          unitPrice: '22.40',
        }),
      );
      const foreignChange = await otherAdmin.put<ErrorBody>(`/api/billing/price-items/${made.id}`, {
        kind: 'consumable',
        name: 'Taken over',
        unit: 'kit',
        unitPrice: '0',
      });
      const foreignArchive = await otherAdmin.delete<ErrorBody>(`/api/billing/price-items/${made.id}`);
      const archived = await ada.delete(`/api/billing/price-items/${made.id}`);
      const again = await ada.delete<ErrorBody>(`/api/billing/price-items/${made.id}`);

      expect(changed.unitPriceMinor).toBe(2240);
      expect([foreignChange.status, foreignArchive.status]).toEqual([404, 404]);
      expect(archived.status).toBe(204);
      expect(again.status).toBe(404);
      const list = await ok<PriceListView>(ada.get('/api/billing/price-list'));
      expect(list.items.at(-1)).toMatchObject({
        id: made.id,
        name: 'Aardvark test kit',
        unitPriceMinor: 2240,
        archived: true,
      });
    });

    it('reads amounts in a currency without decimals: 1250 yen is 1250, and 12.50 yen is refused at the field', async () => {
      const yen = await ok<BillingSettingsView>(
        otherAdmin.put(
          '/api/billing/settings',
          settingsInput({ currency: 'JPY', hourlyRate: '6000', callOutFee: null }),
        ),
      );
      const refusedSettings = await otherAdmin.put<ErrorBody>(
        '/api/billing/settings',
        settingsInput({ currency: 'JPY', hourlyRate: '60.50', callOutFee: null }),
      );
      const refusedItem = await otherAdmin.post<ErrorBody>('/api/billing/price-items', {
        kind: 'consumable',
        name: 'Salt',
        unit: 'bucket',
        unitPrice: '12.50',
      });
      const item = await ok<PriceItemView>(
        otherAdmin.post('/api/billing/price-items', {
          kind: 'consumable',
          name: 'Salt',
          unit: 'bucket',
          unitPrice: '1250',
        }),
        201,
      );

      expect(yen).toMatchObject({ currency: 'JPY', hourlyRateMinor: 6000 });
      expect(refusedSettings.status).toBe(400);
      expect(issuePaths(refusedSettings.body)).toEqual(['body.hourlyRate']);
      expect(refusedSettings.body.error.issues![0]!.message).toBe('JPY has no decimals.');
      expect(refusedItem.status).toBe(400);
      expect(issuePaths(refusedItem.body)).toEqual(['body.unitPrice']);
      expect(item.unitPriceMinor).toBe(1250);
    });

    it('lets the currency change while nothing is issued, but not to one with other decimals while prices are set', async () => {
      const euro = await ok<BillingSettingsView>(
        ada.put('/api/billing/settings', settingsInput({ currency: 'EUR' })),
      );
      const back = await ok<BillingSettingsView>(ada.put('/api/billing/settings', settingsInput()));
      const yen = await ada.put<ErrorBody>(
        '/api/billing/settings',
        settingsInput({ currency: 'JPY', hourlyRate: '6000', callOutFee: '8500' }),
      );

      expect(euro.currency).toBe('EUR');
      expect(back.currency).toBe('GBP');
      expect(yen.status).toBe(409);
      expect(yen.body.error.code).toBe('currency_locked');
      expect((await ok<PriceListView>(ada.get('/api/billing/price-list'))).settings.currency).toBe('GBP');
    });

    it('shows the call-out fee from the price list on the urgent settings, and refuses a request with the old fee (409 fee_changed)', async () => {
      await ok(ada.put('/api/billing/settings', settingsInput({ callOutFee: '90.00' })));
      try {
        const view = await ok<UrgentSettingsView>(olive.get('/api/urgent-settings'));
        await refillUrgentBudgets();
        const stale = await olive.post<ErrorBody>(`/api/tanks/${reef.id}/urgent-requests`, {
          category: 'leak',
          description: 'Water is dripping from the sump onto the floor.',
          someoneOnSite: true,
          phone: '+44 20 7946 0958',
          acceptedCallOutFeeCents: 8500,
        });

        expect(view).toMatchObject({ callOutFeeCents: 9000, currency: 'GBP' });
        expect(stale.status).toBe(409);
        expect(stale.body.error.code).toBe('fee_changed');
        expect(stale.body.error.message).toContain('£90.00');
      } finally {
        await ok(ada.put('/api/billing/settings', settingsInput()));
      }
    });
  });

  /* ------------------------------------------------------------------ drafting */

  describe('POST /api/invoices (drafting)', () => {
    it('drafts a routine visit from its published report: the band for the tank’s litres, then what was used at list prices', async () => {
      const arrivedAt = minutesAgo(90);
      const visit = await publishedVisit('routine', {
        arrivedAt,
        departedAt: minutesAgo(30),
        notes: 'Cleaned the glass and changed the floss.',
        itemsUsed: [
          { priceItemId: items.floss.id, quantity: 4 },
          { priceItemId: items.carbon.id, quantity: 1 },
        ],
      });

      const draft = await ok<InvoiceDetail>(ada.post('/api/invoices', { visitId: visit.id }), 201);

      expect(draft).toMatchObject({
        kind: 'invoice',
        status: 'draft',
        number: null,
        tank: { id: reef.id, name: 'Lobby reef' },
        billToUserId: people.olive.id,
        billToName: 'Olive Owner',
        currency: 'GBP',
        taxRateBp: 2000,
        pricesIncludeTax: true,
        source: { kind: 'visit', id: visit.id },
      });
      expect(
        draft.lines.map((l) => [
          l.kind,
          l.description,
          l.quantityHundredths,
          l.unitPriceMinor,
          l.amountMinor,
          l.priceItemId,
        ]),
      ).toEqual([
        [
          'service',
          `Routine service up to 500 L — ${formatDate(new Date(arrivedAt), london)}`,
          100,
          9500,
          9500,
          items.medium.id,
        ],
        ['consumable', 'Filter floss', 400, 375, 1500, items.floss.id],
        ['consumable', 'Activated carbon', 100, 899, 899, items.carbon.id],
      ]);
      // 95.00 + 15.00 + 8.99 = 118.99, 20 % included: net 118.99 / 1.2 = 99.158… → 99.16, tax 19.83.
      expect([draft.netMinor, draft.taxMinor, draft.totalMinor]).toEqual([9916, 1983, 11899]);
      expect(draft.billToChoices.map((c) => c.name).sort()).toEqual(['Colin Co-owner', 'Olive Owner']);
    });

    it('bills other visits by the time on site, rounded up to quarter hours, at the hourly rate', async () => {
      // 67 minutes on site → 75 minutes billed = 1.25 h × 60.00 = 75.00.
      const arrivedAt = minutesAgo(80);
      const visit = await publishedVisit('equipment', {
        arrivedAt,
        departedAt: minutesAgo(13),
        notes: 'Fitted a new heater.',
        itemsUsed: [{ priceItemId: items.heater.id, quantity: 1 }],
      });

      const draft = await ok<InvoiceDetail>(ada.post('/api/invoices', { visitId: visit.id }), 201);

      expect(
        draft.lines.map((l) => [l.kind, l.quantityHundredths, l.unit, l.unitPriceMinor, l.amountMinor]),
      ).toEqual([
        ['labour', 125, 'hour', 6000, 7500],
        ['part', 100, 'each', 3450, 3450],
      ]);
      expect(draft.lines[0]!.description).toBe(
        `Equipment work: time on site — ${formatDate(new Date(arrivedAt), london)}`,
      );
      expect(draft.totalMinor).toBe(10950);
    });

    it('refuses a visit whose report is not published (409 not_published) and one already invoiced (409 already_invoiced)', async () => {
      const unpublished = await publishedVisit(
        'routine',
        { arrivedAt: minutesAgo(60), notes: 'Half done.' },
        false,
      );
      const done = await publishedVisit('routine', { arrivedAt: minutesAgo(60), notes: 'Done.' });
      const first = await ok<InvoiceDetail>(ada.post('/api/invoices', { visitId: done.id }), 201);

      const notPublished = await ada.post<ErrorBody>('/api/invoices', { visitId: unpublished.id });
      const twice = await ada.post<ErrorBody>('/api/invoices', { visitId: done.id });

      expect(notPublished.status).toBe(409);
      expect(notPublished.body.error.code).toBe('not_published');
      expect(twice.status).toBe(409);
      expect(twice.body.error.code).toBe('already_invoiced');
      expect(twice.body.error.message).toContain(first.id);
      const rows = await stack.database.db.select().from(invoices).where(eq(invoices.sourceVisitId, done.id));
      expect(rows).toHaveLength(1);
    });

    it('drafts a resolved urgent request with the call-out fee stored on it, even after the price list changed', async () => {
      const request = await urgentRequest(8500);
      for (const body of [
        { to: 'acknowledged', eta: new Date(Date.now() + 30 * 60_000).toISOString() },
        { to: 'assigned', technicianId: people.tess.id },
        { to: 'on-the-way' },
        { to: 'on-site' },
        { to: 'resolved', note: 'Re-seated the sump drain and dried the cabinet.' },
      ]) {
        await ok(tess.post(`/api/urgent-requests/${request.id}/moves`, body));
      }
      await ok(ada.put('/api/billing/settings', settingsInput({ callOutFee: '99.00' })));

      try {
        const draft = await ok<InvoiceDetail>(
          ada.post('/api/invoices', { urgentRequestId: request.id }),
          201,
        );
        const twice = await ada.post<ErrorBody>('/api/invoices', { urgentRequestId: request.id });

        expect(draft.source).toMatchObject({ kind: 'urgent', id: request.id });
        expect(
          draft.lines.map((l) => [
            l.kind,
            l.description,
            l.quantityHundredths,
            l.unitPriceMinor,
            l.amountMinor,
          ]),
        ).toEqual([['call-out', 'Urgent call-out', 100, 8500, 8500]]);
        expect(draft.totalMinor).toBe(8500);
        expect(twice.status).toBe(409);
        expect(twice.body.error.code).toBe('already_invoiced');
      } finally {
        await ok(ada.put('/api/billing/settings', settingsInput()));
      }
    });

    it('refuses an urgent request that is not resolved yet (409 not_resolved)', async () => {
      const request = await urgentRequest(8500);

      const res = await ada.post<ErrorBody>('/api/invoices', { urgentRequestId: request.id });

      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('not_resolved');
      expect(
        await stack.database.db.select().from(invoices).where(eq(invoices.sourceUrgentRequestId, request.id)),
      ).toEqual([]);
    });

    it('drafts a blank invoice for a tank; technicians and owners may not, and another company’s tank is not found', async () => {
      const blank = await ok<InvoiceDetail>(ada.post('/api/invoices', { tankId: neighbour.id }), 201);
      const byTechnician = await tess.post<ErrorBody>('/api/invoices', { tankId: reef.id });
      const byOwner = await olive.post<ErrorBody>('/api/invoices', { tankId: reef.id });
      const foreign = await ada.post<ErrorBody>('/api/invoices', { tankId: foreignTank.id });
      const both = await ada.post<ErrorBody>('/api/invoices', { tankId: reef.id, visitId: blank.id });

      expect(blank).toMatchObject({
        status: 'draft',
        lines: [],
        totalMinor: 0,
        billToUserId: people.nina.id,
        source: null,
      });
      expect([byTechnician.status, byOwner.status, foreign.status, both.status]).toEqual([
        403, 403, 404, 400,
      ]);
    });
  });

  /* ------------------------------------------------------------------ editing */

  describe('PUT /api/invoices/:invoiceId (editing a draft)', () => {
    it('recomputes the totals on the server from the lines, whatever totals the client sends', async () => {
      const blank = await ok<InvoiceDetail>(ada.post('/api/invoices', { tankId: reef.id }), 201);

      const saved = await ok<InvoiceDetail>(
        ada.put(invoicePath(blank.id), {
          version: blank.version,
          billToUserId: people.colin.id,
          note: 'Thank you for your custom.',
          lines: workedExample,
          // Not in the schema: dropped before the service sees the body.
          netMinor: 1,
          taxMinor: 1,
          totalMinor: 2,
        }),
      );

      expect(saved.version).toBe(blank.version + 1);
      expect(saved.lines.map((l) => l.amountMinor)).toEqual([9500, 1500, 899, 7500]);
      expect([saved.netMinor, saved.taxMinor, saved.totalMinor]).toEqual([16166, 3233, 19399]);
      const row = await invoiceRow(blank.id);
      expect(row).toMatchObject({
        netMinor: 16166,
        taxMinor: 3233,
        totalMinor: 19399,
        billToUserId: people.colin.id,
        billToName: 'Colin Co-owner',
        billToEmail: people.colin.email,
        note: 'Thank you for your custom.',
      });
    });

    it('refuses a save from an older version (409 stale_version) and keeps the newer one', async () => {
      const draft = await drafted();
      const newer = await ok<InvoiceDetail>(
        ada.put(invoicePath(draft.id), {
          version: draft.version,
          billToUserId: people.olive.id,
          note: 'Newer',
          lines: workedExample.slice(0, 1),
        }),
      );

      const stale = await ada.put<ErrorBody>(invoicePath(draft.id), {
        version: draft.version,
        billToUserId: people.olive.id,
        note: 'Older',
        lines: workedExample,
      });

      expect(stale.status).toBe(409);
      expect(stale.body.error.code).toBe('stale_version');
      expect(await invoiceRow(draft.id)).toMatchObject({
        note: 'Newer',
        totalMinor: 9500,
        version: newer.version,
      });
    });

    it('addresses a draft only to an owner of its tank (400 at billToUserId)', async () => {
      const draft = await drafted();

      const results = await Promise.all(
        [people.nina.id, people.tess.id, people.far.id].map(async (billToUserId) => {
          const current = await invoiceRow(draft.id);
          return ada.put<ErrorBody>(invoicePath(draft.id), {
            version: current.version,
            billToUserId,
            note: '',
            lines: workedExample,
          });
        }),
      );

      for (const res of results) {
        expect(res.status).toBe(400);
        expect(issuePaths(res.body)).toEqual(['body.billToUserId']);
      }
      expect((await invoiceRow(draft.id)).billToUserId).toBe(people.olive.id);
    });

    it('names only the company’s own price-list items on a line (another company’s or none: 400 at the line)', async () => {
      const draft = await drafted();
      const theirs = await otherAdmin.post<PriceItemView>('/api/billing/price-items', {
        kind: 'consumable',
        name: 'Their salt',
        unit: 'bag',
        // Whole units: another test may have set that company's currency to one without decimals.
        unitPrice: '30',
        upToLitres: null,
      });
      expect(theirs.status).toBe(201);

      const res = await ada.put<ErrorBody>(invoicePath(draft.id), {
        version: draft.version,
        billToUserId: people.olive.id,
        note: '',
        lines: [
          line({ description: 'Ours', unitPrice: '3.75', priceItemId: items.floss.id }),
          line({ description: 'Theirs', unitPrice: '30.00', priceItemId: theirs.body.id }),
          line({
            description: 'Nobody’s',
            unitPrice: '1.00',
            priceItemId: '00000000-0000-4000-8000-000000000000',
          }),
        ],
      });

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.lines.1.priceItemId', 'body.lines.2.priceItemId']);
      expect((await invoiceRow(draft.id)).version).toBe(draft.version);
    });

    it('names every bad line field at once, at its place', async () => {
      const draft = await drafted();

      const res = await ada.put<ErrorBody>(invoicePath(draft.id), {
        version: draft.version,
        billToUserId: people.olive.id,
        note: '',
        lines: [
          line({ description: 'Fine', unitPrice: '1.00' }),
          line({ description: 'Three decimals', unitPrice: '1.005' }),
          line({ description: 'No quantity', quantity: '0', unitPrice: '1.00' }),
        ],
      });

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.lines.1.unitPrice', 'body.lines.2.quantity']);
      expect((await invoiceRow(draft.id)).version).toBe(draft.version);
    });

    it('deletes a draft (204), which is then gone', async () => {
      const draft = await drafted();

      const deleted = await ada.delete(invoicePath(draft.id));
      const after = await ada.get<ErrorBody>(invoicePath(draft.id));

      expect(deleted.status).toBe(204);
      expect(after.status).toBe(404);
      expect(
        await stack.database.db.select().from(invoiceLines).where(eq(invoiceLines.invoiceId, draft.id)),
      ).toEqual([]);
    });
  });

  /* ------------------------------------------------------------------ issuing */

  describe('POST /api/invoices/:invoiceId/issue', () => {
    it('numbers the invoice, dates it, and e-mails it with the PDF to the owner it is addressed to', async () => {
      const before = await lastNumber('invoice');
      const dayBefore = today();
      const draft = await drafted();

      const invoice = await ok<InvoiceDetail>(
        ada.post(invoicePath(draft.id, '/issue'), { version: draft.version }),
      );

      const number = `INV-${String(before + 1).padStart(6, '0')}`;
      expect(invoice).toMatchObject({ status: 'issued', number, totalMinor: 19399, balanceMinor: 19399 });
      expect([dayBefore, today()]).toContain(invoice.issueDate);
      expect(invoice.dueDate).toBe(addDays(invoice.issueDate!, 14));
      expect(invoice.seller).toMatchObject({ name: 'Harbourside Aquatic Care Ltd', taxId: 'GB 000 0000 00' });

      const mail: CapturedMail = await stack.mail.waitFor((m) => m.subject.includes(number), 30_000);
      expect(mail.to).toEqual([people.olive.email]);
      expect(mail.subject).toBe(`Invoice ${number} from Harbourside Aquatic Care`);
      expect(mail.text).toContain(formatMoney(19399, 'GBP'));
      expect(mail.text).toContain(`/invoices/${invoice.id}`);
      expect(mail.attachments.map((a) => [a.filename, a.contentType])).toEqual([
        [`${number}.pdf`, 'application/pdf'],
      ]);
      const pdf = readPdf(mail.attachments[0]!.content).text;
      expect(pdf).toContain(number);
      expect(pdf).toContain('£193.99');
      expect(pdf).not.toContain('DRAFT');

      const events = await eventsOf(invoice.id);
      expect(events.map((e) => e.type)).toEqual(['issued']);
      expect(events[0]!.announcedAt).not.toBeNull();
      const sent = await deliveriesOf(invoice.id);
      expect(sent.map((d) => [d.channel, d.destination, d.status])).toEqual([
        ['email', people.olive.email, 'sent'],
      ]);
      const inApp = await stack.database.db
        .select()
        .from(notifications)
        .where(eq(notifications.invoiceEventId, events[0]!.id));
      expect(inApp.map((n) => n.userId)).toEqual([people.olive.id]);
      const [audit] = await stack.database.db
        .select()
        .from(auditEvents)
        .where(and(eq(auditEvents.action, 'invoice.issued'), eq(auditEvents.targetId, invoice.id)));
      expect(audit).toMatchObject({ actorId: people.ada.id });
    });

    it('never changes an issued invoice: saving, deleting or issuing it again answers 409 not_draft', async () => {
      const invoice = await issued();
      const before = await invoiceRow(invoice.id);

      const answers = [
        await ada.put<ErrorBody>(invoicePath(invoice.id), {
          version: invoice.version,
          billToUserId: people.olive.id,
          note: 'Changed',
          lines: workedExample,
        }),
        await ada.delete<ErrorBody>(invoicePath(invoice.id)),
        await ada.post<ErrorBody>(invoicePath(invoice.id, '/issue'), { version: invoice.version }),
      ];

      expect(answers.map((res) => [res.status, res.body.error.code])).toEqual(
        answers.map(() => [409, 'not_draft']),
      );
      expect(await invoiceRow(invoice.id)).toEqual(before);
    });

    it('locks the currency once an invoice is issued (409 currency_locked)', async () => {
      const res = await ada.put<ErrorBody>('/api/billing/settings', settingsInput({ currency: 'EUR' }));
      const list = await ok<PriceListView>(ada.get('/api/billing/price-list'));

      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('currency_locked');
      expect(list.settings).toMatchObject({ currency: 'GBP', currencyLocked: true });
    });

    it('numbers 20 invoices issued at once 1 to 20 after the last one, with no gap and no repeat', async () => {
      const drafts = [];
      for (let i = 0; i < 20; i += 1) {
        drafts.push(
          await drafted([line({ description: `Water change ${i + 1}`, unitPrice: `${10 + i}.00` })]),
        );
      }
      const before = await lastNumber('invoice');

      const answers = await Promise.all(
        drafts.map((d) => ada.post<Detail>(invoicePath(d.id, '/issue'), { version: d.version })),
      );

      expect(answers.map((res) => res.status)).toEqual(drafts.map(() => 200));
      const numbers = answers
        .map((res) => Number(res.body.number!.slice('INV-'.length)))
        .sort((a, b) => a - b);
      expect(numbers).toEqual(Array.from({ length: 20 }, (_, i) => before + 1 + i));
      expect(await lastNumber('invoice')).toBe(before + 20);
    });

    it('gives back the number of an issue that fails, before or after taking it', async () => {
      const before = await lastNumber('invoice');
      const noLines = await ok<InvoiceDetail>(ada.post('/api/invoices', { tankId: reef.id }), 201);
      const noRecipient = await drafted(workedExample, reef, null);
      const failsLate = await drafted();
      await ok(
        ada.put(invoicePath(failsLate.id), {
          version: failsLate.version,
          billToUserId: people.olive.id,
          note: 'refused-by-trigger',
          lines: workedExample,
        }),
      );
      // The issuing UPDATE fails after the number is taken, as a crash or a lost connection would.
      const { pool } = stack.database;
      await pool.query(`create function refuse_issue() returns trigger language plpgsql as $$
        begin if new.note = 'refused-by-trigger' and new.status = 'issued' then raise exception 'refused by the numbering test'; end if; return new; end $$`);
      await pool.query(
        'create trigger refuse_issue before update on invoices for each row execute function refuse_issue()',
      );
      let late: ApiAnswer<ErrorBody>;
      try {
        late = await ada.post<ErrorBody>(invoicePath(failsLate.id, '/issue'), {
          version: failsLate.version + 1,
        });
      } finally {
        await pool.query('drop trigger refuse_issue on invoices');
        await pool.query('drop function refuse_issue()');
      }

      const empty = await ada.post<ErrorBody>(invoicePath(noLines.id, '/issue'), {
        version: noLines.version,
      });
      const nobody = await ada.post<ErrorBody>(invoicePath(noRecipient.id, '/issue'), {
        version: noRecipient.version,
      });
      expect([empty.status, empty.body.error.code]).toEqual([409, 'no_lines']);
      expect([nobody.status, nobody.body.error.code]).toEqual([409, 'no_recipient']);
      expect(late.status).toBe(500);
      expect(await lastNumber('invoice')).toBe(before);
      expect(await invoiceRow(failsLate.id)).toMatchObject({ status: 'draft', number: null });

      const next = await issued();
      expect(next.number).toBe(`INV-${String(before + 1).padStart(6, '0')}`);
    });
  });

  /* ------------------------------------------------------------------ cancelling and credit notes */

  describe('cancelling (void) and credit notes', () => {
    it('cancels an unpaid invoice with a credit note for all of it, its lines negated', async () => {
      const invoice = await issued();
      const creditBefore = await lastNumber('credit-note');

      const voided = await ok<InvoiceDetail>(
        ada.post(invoicePath(invoice.id, '/void'), { reason: 'Billed to the wrong client.' }),
      );

      const cnNumber = `CN-${String(creditBefore + 1).padStart(6, '0')}`;
      expect(voided).toMatchObject({
        status: 'void',
        balanceMinor: 0,
        creditedMinor: -19399,
        reason: 'Billed to the wrong client.',
      });
      expect(voided.related).toHaveLength(1);
      expect(voided.related[0]).toMatchObject({ kind: 'credit-note', number: cnNumber, totalMinor: -19399 });
      const note = await ok<InvoiceDetail>(ada.get(invoicePath(voided.related[0]!.id)));
      expect(note).toMatchObject({
        kind: 'credit-note',
        status: 'issued',
        number: cnNumber,
        netMinor: -16166,
        taxMinor: -3233,
        totalMinor: -19399,
      });
      expect(
        note.lines.map((l) => [l.description, l.quantityHundredths, l.unitPriceMinor, l.amountMinor]),
      ).toEqual(
        invoice.lines.map((l) => [l.description, l.quantityHundredths, -l.unitPriceMinor, -l.amountMinor]),
      );
      expect(note.related).toEqual([expect.objectContaining({ id: invoice.id, number: invoice.number })]);
      const mail = await stack.mail.waitFor((m) => m.subject.includes(cnNumber), 30_000);
      expect(mail.to).toEqual([people.olive.email]);
      expect(mail.attachments[0]!.filename).toBe(`${cnNumber}.pdf`);
    });

    it('refuses to cancel a paid invoice (409): that takes a credit note', async () => {
      const invoice = await issued();
      await ok(recordPayment(invoice.id, '193.99', 'bank-transfer', 'BACS 1'));

      const res = await ada.post<ErrorBody>(invoicePath(invoice.id, '/void'), {
        reason: 'Changed our mind.',
      });

      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('not_voidable');
      expect((await invoiceRow(invoice.id)).status).toBe('paid');
    });

    it('takes part of an invoice back with a credit note, and refuses to take back more than is left (409 credit_too_large)', async () => {
      const invoice = await issued();
      const creditBefore = await lastNumber('credit-note');

      const note = await ok<InvoiceDetail>(
        ada.post(invoicePath(invoice.id, '/credit-notes'), {
          reason: 'The carbon was not used.',
          lines: [
            line({ kind: 'consumable', description: 'Activated carbon', unit: 'bag', unitPrice: '8.99' }),
          ],
        }),
        201,
      );
      const tooLarge = await ada.post<ErrorBody>(invoicePath(invoice.id, '/credit-notes'), {
        reason: 'Everything and more.',
        lines: [line({ description: 'Goodwill', unitPrice: '185.01' })],
      });
      const after = await ok<InvoiceDetail>(ada.get(invoicePath(invoice.id)));

      expect(note).toMatchObject({
        kind: 'credit-note',
        number: `CN-${String(creditBefore + 1).padStart(6, '0')}`,
        totalMinor: -899,
      });
      expect(note.lines.map((l) => [l.unitPriceMinor, l.amountMinor])).toEqual([[-899, -899]]);
      expect(tooLarge.status).toBe(409);
      expect(tooLarge.body.error.code).toBe('credit_too_large');
      expect(after).toMatchObject({ status: 'issued', creditedMinor: -899, balanceMinor: 19399 - 899 });
      expect(await lastNumber('credit-note')).toBe(creditBefore + 1);
    });

    it('refuses credit lines typed as negative amounts (400 at the field)', async () => {
      const invoice = await issued();

      const res = await ada.post<ErrorBody>(invoicePath(invoice.id, '/credit-notes'), {
        reason: 'Typed the wrong way round.',
        lines: [line({ description: 'Refund', unitPrice: '-5.00' })],
      });

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.lines.0.unitPrice']);
      expect((await invoiceRow(invoice.id)).creditedMinor).toBe(0);
    });
  });

  /* ------------------------------------------------------------------ payments */

  describe('POST /api/invoices/:invoiceId/payments (recorded by an admin)', () => {
    it('marks an invoice paid by bank transfer, with one receipt', async () => {
      const invoice = await issued();

      const part = await ok<InvoiceDetail>(recordPayment(invoice.id, '100.00', 'bank-transfer', 'BACS part'));
      const rest = await ok<InvoiceDetail>(recordPayment(invoice.id, '93.99', 'bank-transfer', 'BACS rest'));

      expect(part).toMatchObject({ status: 'issued', paidMinor: 10000, balanceMinor: 9399 });
      expect(rest).toMatchObject({ status: 'paid', paidMinor: 19399, balanceMinor: 0 });
      expect(rest.payments.map((p) => [p.method, p.amountMinor, p.reference])).toEqual([
        ['bank-transfer', 10000, 'BACS part'],
        ['bank-transfer', 9399, 'BACS rest'],
      ]);
      expect((await eventsOf(invoice.id)).map((e) => e.type).sort()).toEqual(['issued', 'paid']);
      const receipt = await stack.mail.waitFor(
        (m) => m.subject === `Receipt for invoice ${invoice.number}`,
        30_000,
      );
      expect(receipt.to).toEqual([people.olive.email]);
      expect(mailsAbout(invoice.number).filter((m) => m.subject.startsWith('Receipt'))).toHaveLength(1);
    });

    it('refuses more than is owed (400 at amount)', async () => {
      const invoice = await issued();

      const res = await recordPayment(invoice.id, '194.00');

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.amount']);
      expect(
        await stack.database.db.select().from(payments).where(eq(payments.invoiceId, invoice.id)),
      ).toEqual([]);
    });

    it('refuses payment, recorded or online, for an invoice that is paid or cancelled (409 not_payable)', async () => {
      const { paid, voided } = await paidAndVoided();

      const answers = [
        await recordPayment(paid.id, '1.00'),
        await recordPayment(voided.id, '1.00'),
        await olive.post<ErrorBody>(invoicePath(paid.id, '/checkout')),
        await olive.post<ErrorBody>(invoicePath(voided.id, '/checkout')),
      ];

      expect(answers.map((res) => [res.status, res.body.error.code])).toEqual(
        answers.map(() => [409, 'not_payable']),
      );
      expect(
        stack.payments.sessions().filter((s) => [paid.id, voided.id].includes(s.client_reference_id ?? '')),
      ).toEqual([]);
    });
  });

  /* ------------------------------------------------------------------ who sees what */

  describe('owners and technicians', () => {
    it('lists to an owner only the issued documents of their own tanks, never a draft', async () => {
      const theirs = await issued();
      const draft = await drafted();
      const ninas = await issued(workedExample, neighbour, people.nina);

      const page = await ok<InvoicePage>(olive.get('/api/invoices'));
      const ninaPage = await ok<InvoicePage>(nina.get('/api/invoices'));

      const ids = page.items.map((item) => item.id);
      expect(ids).toContain(theirs.id);
      expect(ids).not.toContain(draft.id);
      expect(ids).not.toContain(ninas.id);
      expect(page.items.every((item) => item.tank.id === reef.id && item.status !== 'draft')).toBe(true);
      expect(page.items.some((item) => item.kind === 'credit-note')).toBe(true);
      expect(ninaPage.items.map((item) => item.id)).toEqual([ninas.id]);
      expect(ninaPage.totals).toEqual([
        { currency: 'GBP', count: 1, totalMinor: 19399, paidMinor: 0, balanceMinor: 19399 },
      ]);
    });

    it('answers 404 to an owner for a draft, another owner’s invoice and another company’s', async () => {
      const draft = await drafted();
      const ninas = await issued(workedExample, neighbour, people.nina);
      await ok(
        otherAdmin.put(
          '/api/billing/settings',
          settingsInput({ currency: 'JPY', hourlyRate: null, callOutFee: null }),
        ),
      );
      const foreignDraft = await ok<InvoiceDetail>(
        otherAdmin.post('/api/invoices', { tankId: foreignTank.id }),
        201,
      );
      const foreignSaved = await ok<InvoiceDetail>(
        otherAdmin.put(invoicePath(foreignDraft.id), {
          version: foreignDraft.version,
          billToUserId: people.far.id,
          note: '',
          lines: [line({ description: 'Service', unitPrice: '9000' })],
        }),
      );
      const foreign = await ok<InvoiceDetail>(
        otherAdmin.post(invoicePath(foreignDraft.id, '/issue'), { version: foreignSaved.version }),
      );

      const answers = [
        await olive.get<ErrorBody>(invoicePath(draft.id)),
        await olive.get<ErrorBody>(invoicePath(draft.id, '/pdf')),
        await olive.get<ErrorBody>(invoicePath(ninas.id)),
        await olive.get<ErrorBody>(invoicePath(ninas.id, '/pdf')),
        await olive.post<ErrorBody>(invoicePath(ninas.id, '/checkout')),
        await olive.get<ErrorBody>(invoicePath(foreign.id)),
        await ada.get<ErrorBody>(invoicePath(foreign.id)),
        await otherAdmin.get<ErrorBody>(invoicePath(ninas.id)),
        await ada.post<ErrorBody>(invoicePath(foreign.id, '/void'), { reason: 'Not ours.' }),
      ];

      expect(foreign).toMatchObject({ number: 'INV-000001', currency: 'JPY', totalMinor: 9000 });
      expect(answers.map((res) => [res.status, res.body.error.code])).toEqual(
        answers.map(() => [404, 'not_found']),
      );
    });

    it('refuses owners and technicians every change to an invoice (403)', async () => {
      const draft = await drafted();
      const invoice = await issued();
      const change = {
        version: draft.version,
        billToUserId: people.olive.id,
        note: '',
        lines: workedExample,
      };
      const payment = { method: 'cash', amount: '1.00', receivedOn: today(), reference: '' };
      const credit = { reason: 'Goodwill', lines: [line({ description: 'Goodwill', unitPrice: '1.00' })] };

      const answers = await Promise.all(
        [olive, tess].flatMap((who) => [
          who.put<ErrorBody>(invoicePath(draft.id), change),
          who.delete<ErrorBody>(invoicePath(draft.id)),
          who.post<ErrorBody>(invoicePath(draft.id, '/issue'), { version: draft.version }),
          who.post<ErrorBody>(invoicePath(invoice.id, '/void'), { reason: 'Because.' }),
          who.post<ErrorBody>(invoicePath(invoice.id, '/credit-notes'), credit),
          who.post<ErrorBody>(invoicePath(invoice.id, '/payments'), payment),
          who.get<ErrorBody>(`/api/invoices/export.csv?from=${today()}&to=${today()}`),
          who.get<ErrorBody>(`/api/payments/export.csv?from=${today()}&to=${today()}`),
        ]),
      );
      // Paying online is the owner's: staff never pay for a client.
      const staffCheckout = await tess.post<ErrorBody>(invoicePath(invoice.id, '/checkout'));

      expect(answers.map((res) => [res.status, res.body.error.code])).toEqual(
        answers.map(() => [403, 'forbidden']),
      );
      expect(staffCheckout.status).toBe(403);
      expect(await invoiceRow(draft.id)).toMatchObject({ status: 'draft', version: draft.version });
      expect(await invoiceRow(invoice.id)).toMatchObject({
        status: 'issued',
        paidMinor: 0,
        creditedMinor: 0,
      });
    });

    it('lets technicians read invoices, drafts included', async () => {
      const draft = await drafted();

      const list = await ok<InvoicePage>(tess.get(`/api/invoices?status=draft&tankId=${reef.id}`));
      const detail = await ok<InvoiceDetail>(tess.get(invoicePath(draft.id)));

      expect(list.items.map((item) => item.id)).toContain(draft.id);
      expect(list.items.every((item) => item.status === 'draft')).toBe(true);
      expect(detail.totalMinor).toBe(19399);
    });

    it('gives an owner their invoice as a PDF download, and admins a draft marked DRAFT', async () => {
      const invoice = await issued();
      const draft = await drafted();

      const pdf = await olive.get(invoicePath(invoice.id, '/pdf'));
      const draftPdf = await ada.get(invoicePath(draft.id, '/pdf'));

      expect(pdf.status).toBe(200);
      expect(pdf.headers.get('content-type')).toBe('application/pdf');
      expect(pdf.headers.get('content-disposition')).toBe(`attachment; filename="${invoice.number}.pdf"`);
      expect(pdf.bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
      const text = readPdf(pdf.bytes).text;
      expect(text).toContain(invoice.number);
      expect(text).toContain('Olive Owner');
      expect(draftPdf.status).toBe(200);
      expect(readPdf(draftPdf.bytes).text).toContain('DRAFT');
    });
  });

  /* ------------------------------------------------------------------ exports */

  describe('CSV exports', () => {
    it('lists issued documents with plain decimal amounts, a formula-looking client name guarded', async () => {
      const invoice = await issued();
      const formulaInvoice = await issued(
        [line({ description: 'Service', unitPrice: '50.00' })],
        formulaTank,
        people.formula,
      );
      const from = addDays(today(), -1);
      const to = addDays(today(), 1);

      const res = await ada.get(`/api/invoices/export.csv?from=${from}&to=${to}`);

      expect(res.status).toBe(200);
      expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
      expect(res.headers.get('content-disposition')).toBe(
        `attachment; filename="invoices-${from}-to-${to}.csv"`,
      );
      const [header, ...rows] = parseCsv(res.bytes.toString('utf8')).map((record) => record.cells);
      expect(header).toEqual([...invoiceCsvColumns]);
      const byNumber = new Map(
        rows.map((cells) => [cells[0], Object.fromEntries(header!.map((name, i) => [name, cells[i]]))]),
      );
      expect(byNumber.get(invoice.number!)).toMatchObject({
        kind: 'invoice',
        status: 'Awaiting payment',
        client: 'Olive Owner',
        tank: 'Lobby reef',
        currency: 'GBP',
        net: '161.66',
        tax_rate_percent: '20',
        tax: '32.33',
        total: '193.99',
        paid: '0.00',
        balance: '193.99',
      });
      expect(byNumber.get(formulaInvoice.number!)).toMatchObject({
        client: `'=HYPERLINK("https://example.test","Pay here")`,
        total: '50.00',
      });
      expect(rows.every((cells) => cells[1] !== 'draft' && cells[2] !== 'Draft')).toBe(true);
      const credit = rows.find((cells) => cells[1] === 'credit-note');
      expect(credit?.[header!.indexOf('total')]).toMatch(/^-\d+\.\d\d$/);
      expect(credit?.[header!.indexOf('credits_invoice')]).toMatch(/^INV-\d{6}$/);
    });

    it('lists payments received, amounts as decimals', async () => {
      const invoice = await issued();
      await ok(recordPayment(invoice.id, '193.99', 'bank-transfer', '+BACS ref 42'));

      const res = await ada.get(`/api/payments/export.csv?from=${today()}&to=${today()}`);

      expect(res.status).toBe(200);
      const [header, ...rows] = parseCsv(res.bytes.toString('utf8')).map((record) => record.cells);
      expect(header).toEqual([...paymentCsvColumns]);
      expect(rows.find((cells) => cells[1] === invoice.number)).toEqual([
        `${today()}T12:00:00.000Z`,
        invoice.number,
        'Olive Owner',
        'Bank transfer',
        'GBP',
        '193.99',
        "'+BACS ref 42",
      ]);
    });

    it('refuses a range that ends before it starts (400)', async () => {
      const res = await ada.get<ErrorBody>(
        `/api/invoices/export.csv?from=${today()}&to=${addDays(today(), -1)}`,
      );

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['query.to']);
    });
  });

  /* ------------------------------------------------------------------ overdue (last: it moves every issued invoice on) */

  describe('sweepOverdueInvoices', () => {
    /** The sweep as the scheduler runs it, on a clock the test sets to a wall time in London. */
    async function sweepAt(day: string, time: string) {
      const clock = createTestClock(wallInstant(day, time, london));
      return sweepOverdueInvoices({ ...stack.deps, clock: clock.now });
    }
    const eventTypes = async (id: string) => (await eventsOf(id)).map((e) => e.type).sort();
    const reminders = (number: string | null) =>
      mailsAbout(number).filter((m) => m.subject.startsWith('Reminder'));

    it('marks an invoice overdue the day after it was due, reminds at 7 days from 9:00 and at 14 days, each once', async () => {
      const invoice = await issued();
      const due = invoice.dueDate!;

      await sweepAt(due, '23:30');
      expect((await invoiceRow(invoice.id)).status).toBe('issued');

      await sweepAt(addDays(due, 1), '00:30');
      expect((await invoiceRow(invoice.id)).status).toBe('overdue');
      expect(await eventTypes(invoice.id)).toEqual(['issued']);

      await sweepAt(addDays(due, 7), '08:30');
      expect(await eventTypes(invoice.id)).toEqual(['issued']);

      await sweepAt(addDays(due, 7), '09:05');
      await sweepAt(addDays(due, 7), '15:00');
      await sweepAt(addDays(due, 8), '09:05');
      expect(await eventTypes(invoice.id)).toEqual(['issued', 'reminder-7']);

      await sweepAt(addDays(due, 14), '10:00');
      await sweepAt(addDays(due, 14), '10:01');
      await sweepAt(addDays(due, 20), '10:00');
      expect(await eventTypes(invoice.id)).toEqual(['issued', 'reminder-14', 'reminder-7']);

      const sent = reminders(invoice.number);
      expect(sent).toHaveLength(2);
      expect(
        sent.every(
          (m) =>
            m.to.includes(people.olive.email) &&
            m.subject === `Reminder: invoice ${invoice.number} is overdue`,
        ),
      ).toBe(true);
      const page = await ok<InvoicePage>(olive.get('/api/invoices?status=overdue'));
      expect(page.items.map((item) => item.id)).toContain(invoice.id);
    });

    it('sends only the 14-day reminder when the sweep first runs 15 days after the due date', async () => {
      const invoice = await issued();
      const due = invoice.dueDate!;

      await sweepAt(addDays(due, 15), '11:00');
      await sweepAt(addDays(due, 15), '11:01');

      expect((await invoiceRow(invoice.id)).status).toBe('overdue');
      expect(await eventTypes(invoice.id)).toEqual(['issued', 'reminder-14']);
      expect(reminders(invoice.number)).toHaveLength(1);
    });

    it('leaves paid and cancelled invoices alone', async () => {
      const { paid, voided } = await paidAndVoided();

      await sweepAt(addDays(paid.dueDate!, 15), '11:00');

      expect((await invoiceRow(paid.id)).status).toBe('paid');
      expect((await invoiceRow(voided.id)).status).toBe('void');
      expect(await eventTypes(paid.id)).toEqual(['issued', 'paid']);
      expect(await eventTypes(voided.id)).toEqual(['issued']);
    });
  });
});
