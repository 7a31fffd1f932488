import { EmptyState } from '../../../components/states';
import { useMe } from '../../../lib/auth';
import { useInvoiceList } from '../api/list-invoices';
import { PagedInvoices } from './paged-invoices';

const everything = {};

/** The owner's invoices and credit notes for their own tanks, newest first (never drafts). */
export function OwnerInvoices() {
  const { data: me } = useMe();
  const list = useInvoiceList(everything);
  return (
    <PagedInvoices
      list={list}
      audience="owner"
      empty={
        <EmptyState title="No invoices yet">
          Invoices appear here once {me?.company.name ?? 'your maintenance company'} issues one. You are sent
          each one by e-mail too.
        </EmptyState>
      }
    />
  );
}
