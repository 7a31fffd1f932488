import { useCallback, useMemo, useState } from 'react';
import { Link, useLocation, useSearchParams } from 'react-router';
import { EmptyState } from '../../../components/states';
import { can, useMe } from '../../../lib/auth';
import { invoiceSearch, useInvoiceList, type InvoiceFilters } from '../api/list-invoices';
import { narrowsInvoices, readInvoiceAddress } from '../utils/invoice-address';
import { BillingExports } from './billing-exports';
import { InvoiceFilterForm } from './invoice-filter-form';
import { InvoiceTotalsPanel } from './invoice-totals';
import { PagedInvoices } from './paged-invoices';

/** Marks an address change the filter form made itself, so the form is not rebuilt under the cursor. */
const fromFilters = { fromFilters: true };

/**
 * Every invoice and credit note of the company, newest first, filtered by what the address says,
 * with the totals the filters match; admins also download them for their accounts.
 */
export function StaffInvoices() {
  const [params, setParams] = useSearchParams();
  const location = useLocation();
  const { data: me } = useMe();
  const filters = useMemo(() => readInvoiceAddress(params), [params]);
  const list = useInvoiceList(filters);

  // The form starts again from the address whenever something other than the form changed it.
  const [formKey, setFormKey] = useState(location.key);
  const changedByForm = (location.state as typeof fromFilters | null)?.fromFilters === true;
  if (!changedByForm && formKey !== location.key) setFormKey(location.key);

  const onChange = useCallback(
    (next: InvoiceFilters) => setParams(invoiceSearch(next), { replace: true, state: fromFilters }),
    [setParams],
  );
  const oneTank = filters.tankId
    ? list.data?.items.find((item) => item.tank.id === filters.tankId)?.tank
    : undefined;

  return (
    <div className="grid grid-cols-[minmax(0,1fr)] gap-4">
      <InvoiceFilterForm key={formKey} filters={filters} onChange={onChange} />
      {filters.tankId && (
        <p className="flex flex-wrap items-center gap-x-3 text-ink-950">
          <span>Only the documents for {oneTank ? oneTank.name : 'one tank'}.</span>
          <Link
            to={`?${invoiceSearch({ ...filters, tankId: undefined })}`}
            replace
            className="inline-flex min-h-11 items-center font-bold text-brine-700"
          >
            Show every tank
          </Link>
        </p>
      )}
      {list.data && <InvoiceTotalsPanel totals={list.data.totals} />}
      <PagedInvoices
        list={list}
        audience="staff"
        empty={
          narrowsInvoices(filters) ? (
            <EmptyState title="No invoices match these filters">
              <Link
                to="/console/invoices"
                replace
                className="inline-flex min-h-11 items-center font-bold text-brine-700"
              >
                Clear the filters
              </Link>
            </EmptyState>
          ) : (
            <EmptyState title="No invoices yet">
              Draft one from a published visit report or a resolved urgent request.
            </EmptyState>
          )
        }
      />
      {can(me, 'invoices:export') && <BillingExports />}
    </div>
  );
}
