import { Router } from 'express';
import {
  billingExportQuery,
  creditNoteInput,
  invoiceDraftInput,
  invoiceIdParams,
  invoiceListQuery,
  issueInvoiceInput,
  newInvoiceInput,
  recordPaymentInput,
  voidInvoiceInput,
} from '@shared/schemas/billing';
import { renderInvoicePdf } from '../lib/invoice-pdf';
import { created, noContent, openRoute, route, streamed } from '../lib/route';
import { can, publicRoute } from '../policy/index';
import { auditSourceOf } from '../services/audit';
import { invoicesCsv, paymentsCsv } from '../services/billing-exports';
import {
  creditInvoice,
  deleteDraft,
  draftInvoice,
  issueInvoice,
  recordPayment,
  saveDraft,
  voidInvoice,
} from '../services/invoices';
import { getInvoice, listInvoices } from '../services/invoice-views';
import { receiveWebhook, startCheckout } from '../services/payments';
import { Readable } from 'node:stream';

/** Mounted under /invoices. */
export const invoicesRouter = Router();
/** Mounted under /payments: the accountant's export (the webhook is mounted before sessions). */
export const paymentsRouter = Router();
/** Mounted before sessions and CSRF checks at /payments/webhook: the provider signs what it sends instead. */
export const paymentWebhookRouter = Router();

const csvReply = (csv: { fileName: string; lines: AsyncIterable<string> }) =>
  streamed(
    {
      'Content-Type': 'text/csv; charset=utf-8',
      'Content-Disposition': `attachment; filename="${csv.fileName}"`,
    },
    csv.lines,
  );

invoicesRouter.get(
  '/',
  can('invoices:read'),
  route({ query: invoiceListQuery }, ({ deps, actor, query }) => listInvoices(deps, actor, query)),
);
invoicesRouter.get(
  '/export.csv',
  can('invoices:export'),
  route({ query: billingExportQuery }, ({ deps, actor, query }) => csvReply(invoicesCsv(deps, actor, query))),
);
invoicesRouter.post(
  '/',
  can('invoices:manage'),
  route({ body: newInvoiceInput }, async ({ deps, actor, body }) =>
    created(await draftInvoice(deps, actor, body)),
  ),
);
invoicesRouter.get(
  '/:invoiceId',
  can('invoices:read'),
  route({ params: invoiceIdParams }, ({ deps, actor, params }) => getInvoice(deps, actor, params.invoiceId)),
);
invoicesRouter.get(
  '/:invoiceId/pdf',
  can('invoices:read'),
  route({ params: invoiceIdParams }, async ({ deps, actor, params }) => {
    const detail = await getInvoice(deps, actor, params.invoiceId);
    const pdf = await renderInvoicePdf(detail, { companyName: actor.companyName, timeZone: detail.timeZone });
    return streamed(
      {
        'Content-Type': 'application/pdf',
        'Content-Disposition': `attachment; filename="${detail.number ?? 'draft-invoice'}.pdf"`,
        'Content-Length': String(pdf.length),
      },
      Readable.from([pdf]),
    );
  }),
);
invoicesRouter.put(
  '/:invoiceId',
  can('invoices:manage'),
  route({ params: invoiceIdParams, body: invoiceDraftInput }, ({ deps, actor, params, body }) =>
    saveDraft(deps, actor, params.invoiceId, body),
  ),
);
invoicesRouter.delete(
  '/:invoiceId',
  can('invoices:manage'),
  route({ params: invoiceIdParams }, async ({ deps, actor, params }) => {
    await deleteDraft(deps, actor, params.invoiceId);
    return noContent();
  }),
);
invoicesRouter.post(
  '/:invoiceId/issue',
  can('invoices:manage'),
  route({ params: invoiceIdParams, body: issueInvoiceInput }, (ctx) =>
    issueInvoice(ctx.deps, ctx.actor, ctx.params.invoiceId, ctx.body.version, auditSourceOf(ctx)),
  ),
);
invoicesRouter.post(
  '/:invoiceId/void',
  can('invoices:manage'),
  route({ params: invoiceIdParams, body: voidInvoiceInput }, (ctx) =>
    voidInvoice(ctx.deps, ctx.actor, ctx.params.invoiceId, ctx.body.reason, auditSourceOf(ctx)),
  ),
);
invoicesRouter.post(
  '/:invoiceId/credit-notes',
  can('invoices:manage'),
  route({ params: invoiceIdParams, body: creditNoteInput }, async (ctx) =>
    created(await creditInvoice(ctx.deps, ctx.actor, ctx.params.invoiceId, ctx.body, auditSourceOf(ctx))),
  ),
);
invoicesRouter.post(
  '/:invoiceId/payments',
  can('invoices:manage'),
  route({ params: invoiceIdParams, body: recordPaymentInput }, (ctx) =>
    recordPayment(ctx.deps, ctx.actor, ctx.params.invoiceId, ctx.body, auditSourceOf(ctx)),
  ),
);
invoicesRouter.post(
  '/:invoiceId/checkout',
  can('invoices:pay'),
  route({ params: invoiceIdParams }, ({ deps, actor, params }) =>
    startCheckout(deps, actor, params.invoiceId),
  ),
);

paymentsRouter.get(
  '/export.csv',
  can('invoices:export'),
  route({ query: billingExportQuery }, ({ deps, actor, query }) => csvReply(paymentsCsv(deps, actor, query))),
);

paymentWebhookRouter.post(
  '/',
  publicRoute,
  openRoute({}, ({ deps, rawBody, header }) => receiveWebhook(deps, rawBody, header('stripe-signature'))),
);
