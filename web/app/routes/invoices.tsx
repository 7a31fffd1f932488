import { Navigate, useLocation, useParams } from 'react-router';
import { Page } from '../../components/page';
import { OwnerInvoiceDetail } from '../../features/invoices/components/owner-invoice-detail';
import { OwnerInvoices } from '../../features/invoices/components/owner-invoices';
import { can, useMe } from '../../lib/auth';

/** Staff who follow an owner's link read the same document in the console. */
function useStaffRedirect(): string | null {
  const { data: me } = useMe();
  const { pathname } = useLocation();
  return can(me, 'clients:read') ? `/console${pathname}` : null;
}

export function OwnerInvoicesRoute() {
  const staffTo = useStaffRedirect();
  if (staffTo) return <Navigate to={staffTo} replace />;
  return (
    <Page title="Invoices" description="Invoices and credit notes for your tanks, newest first.">
      <title>Invoices — Brinewatch</title>
      <OwnerInvoices />
    </Page>
  );
}

export function OwnerInvoiceRoute() {
  const { invoiceId = '' } = useParams();
  const staffTo = useStaffRedirect();
  if (staffTo) return <Navigate to={staffTo} replace />;
  return <OwnerInvoiceDetail key={invoiceId} invoiceId={invoiceId} />;
}
