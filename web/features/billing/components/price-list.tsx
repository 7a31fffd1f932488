import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { usePriceList } from '../../../lib/queries/price-list';
import { BillingSettingsForm } from './billing-settings-form';
import { PriceItems } from './price-items';

/** The company's price list (admins): what each kind of work and item costs, and how it is invoiced. */
export function PriceList() {
  const priceList = usePriceList();
  if (priceList.isPending) return <LoadingState label="Loading the price list…" />;
  if (priceList.isError) {
    return (
      <ErrorState error={priceList.error} what="the price list" onRetry={() => void priceList.refetch()} />
    );
  }
  const { settings, items } = priceList.data;
  const empty = items.every((item) => item.archived);
  return (
    <div className="grid grid-cols-[minmax(0,1fr)] gap-6">
      <p
        className={`rounded-card p-4 ${settings.onlinePayment ? 'bg-healthy-100 text-ink-950' : 'bg-ink-100 text-ink-950'}`}
      >
        <span className="font-bold">Online payment is {settings.onlinePayment ? 'on' : 'off'}.</span>{' '}
        {settings.onlinePayment
          ? 'Owners can pay an issued invoice by card from its page.'
          : 'Owners pay by transfer or in person; record each payment on its invoice.'}
      </p>
      <div className="grid grid-cols-[minmax(0,1fr)] items-start gap-6 lg:grid-cols-[minmax(0,7fr)_minmax(0,5fr)]">
        <div className="grid grid-cols-[minmax(0,1fr)] gap-4">
          {empty && (
            <EmptyState title="No prices yet — add routine service bands first">
              Check the currency in the settings, then price a routine visit for each tank size you serve.
              Consumables and parts can follow.
            </EmptyState>
          )}
          <PriceItems items={items} currency={settings.currency} />
        </div>
        <div className="grid grid-cols-[minmax(0,1fr)] gap-4">
          <h2 className="text-xl font-bold text-ink-900">Settings</h2>
          <BillingSettingsForm settings={settings} />
        </div>
      </div>
    </div>
  );
}
