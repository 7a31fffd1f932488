import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it, onTestFinished } from 'vitest';
import { formatMoney, minorToText } from '@shared/billing/money';
import type { InvoiceDetail, InvoicePage, PriceItemView, PriceListView } from '@shared/schemas/billing';
import type { TankDetail } from '@shared/schemas/tanks';
import type { TankVisits } from '@shared/schemas/visits';
import { demoId } from '../../api/dev/seed/index';
import {
  apiInPage,
  artifactsDir,
  type BrowserSession,
  expectAxeClean,
  checkAtBothWidths,
  openBrowser,
  screenshot,
  signInAt,
  type viewports,
} from '../helpers/browser';
import { readPdf } from '../helpers/pdf-text';

/*
 * Billing in the browser. An admin drafts the invoice of a published visit report from the report
 * itself, checks the line drafted from the price list and issues it; the owner, on a phone, opens it
 * from her list, pays it on the payment provider's hosted page (the local stand-in, with the
 * provider's published test cards: docs.stripe.com/testing) and sees it paid once the webhook has
 * arrived; the receipt and the invoice reach her by e-mail with the PDF. A declined card leaves the
 * invoice open. The price list is the admin's only, and the staff list filters by status.
 *
 * The e2e database is shared by every browser test file in a run, and issued invoices are never
 * deleted: rows are found by what this file made, never by their numbers.
 */

const adminEmail = 'mara@driftglass.test';
const technicianEmail = 'tomas@driftglass.test';
const ownerEmail = 'helen@ashdown-home.test';
/** Helen's two tanks: the living room reef first (the seed's invoices are for it). */
const helensTanks = [demoId('ashdown-reef'), demoId('ashdown-river')];
/** The provider's published test cards (docs.stripe.com/testing): a success and a generic decline. */
const successCard = '4242 4242 4242 4242';
const declinedCard = '4000 0000 0000 0002';
/** The webhook can lag behind the redirect on a loaded machine; the page asks again every 2 s for 2 min. */
const webhookWithinMs = 110_000;

interface Mail {
  id: string;
  to: string[];
  subject: string;
  text: string;
  headers: Record<string, string>;
  attachments: { filename: string; contentType: string; size: number; url: string }[];
}

async function mailbox(): Promise<Mail[]> {
  return (await (await fetch(`${inject('mailboxUrl')}/api/messages`)).json()) as Mail[];
}

/** Messages about one invoice and one of its events (issued, paid…), as the app marks them. */
async function invoiceMails(invoiceId: string, event: string): Promise<Mail[]> {
  return (await mailbox()).filter(
    (mail) =>
      mail.headers['x-brinewatch-invoice'] === invoiceId &&
      mail.headers['x-brinewatch-invoice-event'] === event,
  );
}

/** The text of a PDF attached to a captured message, read as a viewer would. */
async function attachedPdfText(attachment: Mail['attachments'][number]): Promise<string> {
  const response = await fetch(`${inject('mailboxUrl')}${attachment.url}`);
  return readPdf(Buffer.from(await response.arrayBuffer())).text;
}

/** A page whose waits suit a loaded 2-core machine. */
async function newPage(session: BrowserSession, viewport: keyof typeof viewports): Promise<Page> {
  const page = await session.newPage(viewport);
  page.setDefaultTimeout(60_000);
  page.setDefaultNavigationTimeout(60_000);
  return page;
}

/** Every invoice and credit note of a tank, through every page of the list. */
async function invoicesOfTank(page: Page, tankId: string): Promise<InvoicePage['items']> {
  const items: InvoicePage['items'] = [];
  let cursor: string | null = null;
  do {
    const after: string = cursor ? `&after=${encodeURIComponent(cursor)}` : '';
    const found: InvoicePage = await apiInPage<InvoicePage>(
      page,
      'GET',
      `/invoices?tankId=${tankId}${after}`,
    );
    items.push(...found.items);
    cursor = found.nextCursor;
  } while (cursor);
  return items;
}

/**
 * The newest published routine report of one of Helen's tanks that no live invoice was drafted from
 * yet (so drafting it is not refused as already invoiced), with its tank.
 */
async function uninvoicedReport(admin: Page): Promise<{ tankId: string; visitId: string } | null> {
  for (const tankId of helensTanks) {
    const invoiced = new Set<string>();
    for (const item of await invoicesOfTank(admin, tankId)) {
      if (item.kind !== 'invoice' || item.status === 'void') continue;
      const detail = await apiInPage<InvoiceDetail>(admin, 'GET', `/invoices/${item.id}`);
      if (detail.source?.kind === 'visit') invoiced.add(detail.source.id);
    }
    const { visits } = await apiInPage<TankVisits>(admin, 'GET', `/tanks/${tankId}/visits`);
    const report = visits.find(
      (visit) => visit.status === 'published' && visit.kind === 'routine' && !invoiced.has(visit.id),
    );
    if (report) return { tankId, visitId: report.id };
  }
  return null;
}

/** An expiry date a few years ahead, as MM/YY. */
function futureExpiry(): string {
  return `12/${String((new Date().getUTCFullYear() + 3) % 100).padStart(2, '0')}`;
}

/** The status badge in the document's own header (the word "Paid" also names a date and a sum below). */
const statusOf = (page: Page, title: string) => page.getByRole('article', { name: title }).locator('header');

/** On the stand-in's hosted page: types the card and pays. */
async function payWithCard(page: Page, card: string) {
  await page.getByRole('textbox', { name: 'Card number' }).fill(card);
  await page.getByRole('textbox', { name: 'Expiry date' }).fill(futureExpiry());
  await page.getByRole('textbox', { name: 'Security code' }).fill('123');
  await page.getByRole('textbox', { name: 'Name on the card' }).fill('Helen Ashdown');
  await page.getByRole('button', { name: /^Pay / }).click();
}

describe('billing in the browser', () => {
  let session: BrowserSession;
  /** The invoice the first story paid, for the staff list's paid filter to show. */
  let paidInStory: { id: string; number: string } | null = null;

  beforeAll(async () => {
    session = await openBrowser();
  });
  afterAll(() => session.close());

  it('drafts an invoice from a published report, issues it, and the owner pays it on her phone', async () => {
    const admin = await signInAt(await newPage(session, 'desktop'), '/console/invoices', adminEmail);
    const found = await uninvoicedReport(admin);
    expect(found, 'a published routine report of Helen’s without an invoice').not.toBeNull();
    const { tankId, visitId } = found!;

    // The line the report should be drafted with: the routine band the tank's system volume fits
    // (the smallest band it fits; the band without a size covers anything larger).
    const tank = await apiInPage<TankDetail>(admin, 'GET', `/tanks/${tankId}`);
    const priceList = await apiInPage<PriceListView>(admin, 'GET', '/billing/price-list');
    const litres = tank.displayVolumeL + tank.sumpVolumeL;
    const band = priceList.items
      .filter((item) => item.kind === 'routine' && !item.archived)
      .sort((a, b) => (a.upToLitres ?? Infinity) - (b.upToLitres ?? Infinity))
      .find((item) => item.upToLitres === null || litres <= item.upToLitres)!;
    expect(band, 'a routine band for the tank').toBeDefined();

    // The admin opens the published report on the tank's page and drafts its invoice.
    await admin.goto(`/tanks/${tankId}?section=visits&visit=${visitId}`);
    const draftButton = admin.getByRole('button', { name: 'Draft invoice' });
    await draftButton.waitFor();
    await checkAtBothWidths(admin, 'billing-report-with-draft-button', 'desktop');
    await draftButton.click();
    await admin.waitForURL(/\/console\/invoices\/[0-9a-f-]{36}$/);
    const invoiceId = new URL(admin.url()).pathname.split('/').at(-1)!;
    onTestFinished(() => admin.close());

    // The draft editor, with the routine band drafted from the report and Helen to pay it.
    const editor = admin.getByRole('form', { name: 'Edit the draft' });
    const firstLine = editor.getByRole('group', { name: 'Line 1' });
    await firstLine.waitFor();
    expect(await firstLine.getByLabel('Description').inputValue()).toMatch(
      new RegExp(`^${band.name.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')} — `),
    );
    expect(await firstLine.getByLabel('Kind').inputValue()).toBe('service');
    expect(await firstLine.getByLabel('Quantity').inputValue()).toBe('1');
    expect(await firstLine.getByLabel('Unit price').inputValue()).toBe(
      minorToText(band.unitPriceMinor, priceList.settings.currency),
    );
    const draft = await apiInPage<InvoiceDetail>(admin, 'GET', `/invoices/${invoiceId}`);
    expect(draft).toMatchObject({ status: 'draft', number: null, source: { kind: 'visit', id: visitId } });
    expect(draft.billToEmail).toBe(ownerEmail);
    expect(await editor.getByLabel('Bill to').inputValue()).toBe(draft.billToUserId);
    await admin.getByRole('heading', { level: 1, name: 'Draft invoice' }).waitFor();
    await checkAtBothWidths(admin, 'billing-draft-editor', 'desktop');

    // Issued after a question naming whom it goes to.
    await editor.getByRole('button', { name: 'Issue and e-mail' }).click();
    const confirm = admin.getByRole('dialog', { name: 'Issue and e-mail this invoice?' });
    await confirm.getByText(ownerEmail).waitFor();
    await confirm.getByRole('button', { name: 'Issue and e-mail' }).click();
    await admin.getByText(`is issued and on its way to ${ownerEmail}`, { exact: false }).waitFor();
    const issued = await apiInPage<InvoiceDetail>(admin, 'GET', `/invoices/${invoiceId}`);
    expect(issued.status).toBe('issued');
    expect(issued.number).toMatch(/^INV-\d{6}$/);
    const number = issued.number!;
    const title = `Invoice ${number}`;
    await admin.getByRole('heading', { level: 1, name: title }).waitFor();
    await statusOf(admin, title).getByText('Awaiting payment', { exact: true }).waitFor();
    expect(await editor.count()).toBe(0);
    await checkAtBothWidths(admin, 'billing-issued-invoice', 'desktop');

    // The owner, on a phone, finds it in her list.
    const owner = await signInAt(await newPage(session, 'phone'), '/invoices', ownerEmail);
    onTestFinished(() => owner.close());
    const link = owner.getByRole('link', { name: title, exact: true });
    await link.waitFor();
    await checkAtBothWidths(owner, 'billing-owner-invoices', 'phone');
    await link.click();
    await owner.waitForURL(`**/invoices/${invoiceId}`);
    const payBox = owner.getByRole('region', { name: 'Pay this invoice' });
    await payBox.getByText(`${formatMoney(issued.balanceMinor, issued.currency)} is due`).waitFor();
    await statusOf(owner, title).getByText('Awaiting payment', { exact: true }).waitFor();
    await checkAtBothWidths(owner, 'billing-owner-invoice-open', 'phone');

    // Paid on the provider's page with its success test card.
    const standIn = new URL(inject('paymentsStandIn').url).origin;
    await payBox.getByRole('button', { name: 'Pay now' }).click();
    await owner.waitForURL((url) => url.origin === standIn);
    await owner
      .getByRole('heading', { level: 1, name: `Pay ${formatMoney(issued.balanceMinor, issued.currency)}` })
      .waitFor();
    await screenshot(owner, 'billing-provider-page-phone');
    await payWithCard(owner, successCard);

    // Back in Brinewatch, the page waits for the provider's word, then says it is paid.
    await owner.waitForURL((url) => url.pathname === `/invoices/${invoiceId}` && url.search === '?paid=1');
    await owner
      .getByRole('status')
      .filter({ hasText: 'Paid — thank you. A receipt is on its way by e-mail.' })
      .waitFor({ timeout: webhookWithinMs });
    await statusOf(owner, title).getByText('Paid', { exact: true }).waitFor();
    expect(await owner.getByRole('button', { name: 'Pay now' }).count()).toBe(0);
    const paid = await apiInPage<InvoiceDetail>(owner, 'GET', `/invoices/${invoiceId}`);
    expect(paid).toMatchObject({ status: 'paid', balanceMinor: 0, paidMinor: issued.totalMinor });
    expect(paid.payments.map((payment) => [payment.method, payment.amountMinor])).toEqual([
      ['card-online', issued.totalMinor],
    ]);
    await checkAtBothWidths(owner, 'billing-owner-invoice-paid', 'phone');
    paidInStory = { id: invoiceId, number };

    // The receipt: once the provider's events for this invoice are all delivered, exactly one.
    await expect
      .poll(async () => (await invoiceMails(invoiceId, 'paid')).length, { timeout: 60_000, interval: 1000 })
      .toBeGreaterThan(0);
    await expect
      .poll(
        async () => {
          const deliveries = (await (
            await fetch(`${inject('paymentsStandIn').url}/_stand-in/events`)
          ).json()) as { event: { data: { object: { client_reference_id?: string } } }; status: string }[];
          const ours = deliveries.filter(
            (delivery) => delivery.event.data.object.client_reference_id === invoiceId,
          );
          return ours.length > 0 && ours.every((delivery) => delivery.status === 'delivered');
        },
        { timeout: 60_000, interval: 1000 },
      )
      .toBe(true);
    const receipts = await invoiceMails(invoiceId, 'paid');
    expect(receipts).toHaveLength(1);
    const receipt = receipts[0]!;
    expect(receipt.to).toEqual([ownerEmail]);
    expect(receipt.subject).toBe(`Receipt for invoice ${number}`);
    expect(receipt.attachments.map((file) => [file.filename, file.contentType])).toEqual([
      [`${number}.pdf`, 'application/pdf'],
    ]);
    expect(await attachedPdfText(receipt.attachments[0]!)).toContain(number);

    // The invoice itself went to Helen with its PDF when it was issued.
    const issueMails = await invoiceMails(invoiceId, 'issued');
    expect(issueMails).toHaveLength(1);
    expect(issueMails[0]!.to).toEqual([ownerEmail]);
    expect(issueMails[0]!.subject).toMatch(new RegExp(`^Invoice ${number} from `));
    expect(issueMails[0]!.text).toContain(`/invoices/${invoiceId}`);
    expect(issueMails[0]!.attachments.map((file) => [file.filename, file.contentType])).toEqual([
      [`${number}.pdf`, 'application/pdf'],
    ]);
    const issuedPdf = await attachedPdfText(issueMails[0]!.attachments[0]!);
    expect(issuedPdf).toContain(number);
    expect(issuedPdf).toContain(formatMoney(issued.totalMinor, issued.currency));
  });

  it('keeps an invoice open when the card is declined', async () => {
    // The admin makes and issues a small invoice for the kids' river tank through the API.
    const admin = await signInAt(await newPage(session, 'desktop'), '/console/invoices', adminEmail);
    onTestFinished(() => admin.close());
    const blank = await apiInPage<InvoiceDetail>(admin, 'POST', '/invoices', { tankId: helensTanks[1] });
    expect(blank.billToEmail).toBe(ownerEmail);
    const draft = await apiInPage<InvoiceDetail>(admin, 'PUT', `/invoices/${blank.id}`, {
      version: blank.version,
      billToUserId: blank.billToUserId,
      note: 'Float switch replaced on a call between visits.',
      lines: [
        {
          kind: 'part',
          description: 'Top-off float switch',
          quantity: '1',
          unit: 'each',
          unitPrice: '18.00',
        },
      ],
    });
    const issued = await apiInPage<InvoiceDetail>(admin, 'POST', `/invoices/${blank.id}/issue`, {
      version: draft.version,
    });
    const title = `Invoice ${issued.number!}`;

    const owner = await signInAt(await newPage(session, 'phone'), `/invoices/${issued.id}`, ownerEmail);
    onTestFinished(() => owner.close());
    const payBox = owner.getByRole('region', { name: 'Pay this invoice' });
    await payBox.getByRole('button', { name: 'Pay now' }).click();
    const standIn = new URL(inject('paymentsStandIn').url).origin;
    await owner.waitForURL((url) => url.origin === standIn);
    await payWithCard(owner, declinedCard);

    // The provider's page says so and keeps the payment open.
    await owner.getByRole('alert').getByText('The card was declined. Try another card.').waitFor();
    expect(new URL(owner.url()).origin).toBe(standIn);
    await screenshot(owner, 'billing-provider-declined-phone');

    // Back without paying: the invoice still waits to be paid, and can still be paid.
    await owner.getByRole('link', { name: 'Cancel and go back without paying' }).click();
    await owner.waitForURL((url) => url.pathname === `/invoices/${issued.id}` && url.search === '');
    await statusOf(owner, title).getByText('Awaiting payment', { exact: true }).waitFor();
    await payBox.getByRole('button', { name: 'Pay now' }).waitFor();
    const after = await apiInPage<InvoiceDetail>(owner, 'GET', `/invoices/${issued.id}`);
    expect(after).toMatchObject({ status: 'issued', paidMinor: 0, balanceMinor: issued.totalMinor });
    expect(after.payments).toEqual([]);
    await checkAtBothWidths(owner, 'billing-owner-invoice-after-decline', 'phone');
  });

  it('lets an admin add a consumable to the price list, and keeps technicians out', async () => {
    const admin = await signInAt(await newPage(session, 'phone'), '/console/billing', adminEmail);
    onTestFinished(() => admin.close());
    const consumables = admin.getByRole('region', { name: 'Consumables' });
    await consumables.getByRole('button', { name: 'Add a consumable' }).waitFor();
    await checkAtBothWidths(admin, 'billing-price-list', 'phone');

    const name = `Phosphate remover, 250 ml ${Date.now().toString(36)}`;
    await consumables.getByRole('button', { name: 'Add a consumable' }).click();
    const sheet = admin.getByRole('dialog', { name: 'Add a consumable' });
    await sheet.getByLabel('Name').fill(name);
    await sheet.getByLabel('Unit', { exact: true }).fill('tub');
    await sheet.getByLabel('Price per unit').fill('12.40');
    await expectAxeClean(admin, 'the new consumable sheet at 390 px');
    // The sheet is fixed to the bottom of the screen: pictured itself, not on a stretched full page.
    await sheet.screenshot({ path: path.join(artifactsDir, 'billing-add-consumable-phone.png') });
    await sheet.getByRole('button', { name: 'Add a consumable' }).click();
    await sheet.waitFor({ state: 'detached' });

    const row = consumables.getByRole('listitem').filter({ hasText: name });
    await row.getByText(`${formatMoney(1240, 'GBP')} per tub`).waitFor();
    const listed = await apiInPage<PriceListView>(admin, 'GET', '/billing/price-list');
    const added = listed.items.find((item: PriceItemView) => item.name === name);
    expect(added).toMatchObject({ kind: 'consumable', unit: 'tub', unitPriceMinor: 1240, archived: false });
    // Archived again at the end, so other tests find the price list as the demo leaves it.
    onTestFinished(async () => {
      await apiInPage(admin, 'DELETE', `/billing/price-items/${added!.id}`);
    });
    await checkAtBothWidths(admin, 'billing-price-list-added', 'desktop');

    // A technician reads prices through the API for reports, but the price list screen is not theirs.
    const technician = await signInAt(await newPage(session, 'desktop'), '/console/billing', technicianEmail);
    onTestFinished(() => technician.close());
    await technician
      .getByRole('heading', { level: 1, name: 'This part of Brinewatch is not for your account' })
      .waitFor();
    expect(await technician.getByRole('region', { name: 'Consumables' }).count()).toBe(0);
    expect(await technician.getByRole('link', { name: 'Price list', exact: true }).count()).toBe(0);
    await checkAtBothWidths(technician, 'billing-price-list-technician', 'desktop');
  });

  it('filters the staff list to paid documents, with their totals', async () => {
    const admin = await signInAt(await newPage(session, 'desktop'), '/console/invoices', adminEmail);
    onTestFinished(() => admin.close());
    const everything = await apiInPage<InvoicePage>(admin, 'GET', '/invoices');
    const paidOnes = await apiInPage<InvoicePage>(admin, 'GET', '/invoices?status=paid');
    expect(paidOnes.items.length).toBeGreaterThan(0);
    expect(paidOnes.items.every((item) => item.status === 'paid')).toBe(true);
    // Issued documents that are not paid: none of them may show under the filter.
    const unpaidNumbers = everything.items
      .filter((item) => item.status !== 'paid' && item.number !== null)
      .map((item) => item.number!);
    expect(unpaidNumbers.length).toBeGreaterThan(0);

    // Chosen in the form, the filter goes into the address.
    const search = admin.getByRole('search', { name: 'Find invoices' });
    await search.getByLabel('Status').selectOption('paid');
    await admin.waitForURL((url) => url.pathname === '/console/invoices' && url.search === '?status=paid');

    const table = admin.getByRole('table', { name: 'Invoices and credit notes, newest first' });
    const rows = table.locator('tbody tr');
    await expect.poll(() => rows.count(), { timeout: 60_000 }).toBe(paidOnes.items.length);
    for (const status of await rows.locator('td:nth-child(3)').allTextContents()) {
      expect(status.trim()).toBe('Paid');
    }
    const shownTitles = await table.locator('tbody tr td:first-child a').allTextContents();
    expect(shownTitles).toEqual(
      paidOnes.items.map((item) => `${item.kind === 'invoice' ? 'Invoice' : 'Credit note'} ${item.number}`),
    );
    for (const unpaid of unpaidNumbers) expect(shownTitles.join('\n')).not.toContain(unpaid);
    if (paidInStory) expect(shownTitles).toContain(`Invoice ${paidInStory.number}`);

    // The totals box: what the filter matches in all, nothing left to pay.
    const totals = admin.getByRole('region', { name: 'Totals for these filters' });
    const gbp = paidOnes.totals.find((row) => row.currency === 'GBP')!;
    expect(gbp).toMatchObject({ balanceMinor: 0, paidMinor: gbp.totalMinor });
    const figure = (term: string) =>
      totals
        .locator('dl[aria-label="GBP"] > div')
        .filter({ has: admin.locator('dt', { hasText: new RegExp(`^${term}$`) }) })
        .locator('dd');
    await expect.poll(() => figure('Documents').textContent()).toBe(`${gbp.count} in GBP`);
    expect(await figure('Total').textContent()).toBe(formatMoney(gbp.totalMinor, 'GBP'));
    expect(await figure('Paid').textContent()).toBe(formatMoney(gbp.paidMinor, 'GBP'));
    expect(await figure('Balance due').textContent()).toBe(formatMoney(0, 'GBP'));
    await checkAtBothWidths(admin, 'billing-staff-invoices-paid', 'phone');

    // On the phone, the same documents as cards.
    const cardLinks = admin.getByRole('main').getByRole('link', { name: /^(Invoice|Credit note) / });
    expect(await cardLinks.allTextContents()).toEqual(shownTitles);
  });
});
