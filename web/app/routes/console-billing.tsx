import { Page } from '../../components/page';
import { PriceList } from '../../features/billing/components/price-list';

export function ConsoleBillingRoute() {
  return (
    <Page
      title="Price list"
      description="What routine visits, consumables and parts cost, and how invoices are made out."
    >
      <title>Price list — Brinewatch</title>
      <PriceList />
    </Page>
  );
}
