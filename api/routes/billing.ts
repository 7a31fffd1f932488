import { Router } from 'express';
import { billingSettingsInput, priceItemIdParams, priceItemInput } from '@shared/schemas/billing';
import { created, noContent, route } from '../lib/route';
import { can } from '../policy/index';
import { auditSourceOf } from '../services/audit';
import {
  archivePriceItem,
  createPriceItem,
  getPriceList,
  saveBillingSettings,
  updatePriceItem,
} from '../services/price-list';

/** Mounted under /billing: the company's price list and billing settings. */
export const billingRouter = Router();

billingRouter.get(
  '/price-list',
  can('billing:read'),
  route({}, ({ deps, actor }) => getPriceList(deps, actor)),
);
billingRouter.put(
  '/settings',
  can('billing:manage'),
  route({ body: billingSettingsInput }, (ctx) =>
    saveBillingSettings(ctx.deps, ctx.actor, ctx.body, auditSourceOf(ctx)),
  ),
);
billingRouter.post(
  '/price-items',
  can('billing:manage'),
  route({ body: priceItemInput }, async ({ deps, actor, body }) =>
    created(await createPriceItem(deps, actor, body)),
  ),
);
billingRouter.put(
  '/price-items/:priceItemId',
  can('billing:manage'),
  route({ params: priceItemIdParams, body: priceItemInput }, ({ deps, actor, params, body }) =>
    updatePriceItem(deps, actor, params.priceItemId, body),
  ),
);
billingRouter.delete(
  '/price-items/:priceItemId',
  can('billing:manage'),
  route({ params: priceItemIdParams }, async ({ deps, actor, params }) => {
    await archivePriceItem(deps, actor, params.priceItemId);
    return noContent();
  }),
);
