import { useParams } from 'react-router';
import { Page } from '../../components/page';
import { StaffInvoiceDetail } from '../../features/invoices/components/staff-invoice-detail';
import { StaffInvoices } from '../../features/invoices/components/staff-invoices';

export function ConsoleInvoicesRoute() {
  return (
    <Page title="Invoices" description="Every invoice and credit note of the company, newest first.">
      <title>Invoices — Brinewatch</title>
      <StaffInvoices />
    </Page>
  );
}

export function ConsoleInvoiceRoute() {
  const { invoiceId = '' } = useParams();
  return <StaffInvoiceDetail key={invoiceId} invoiceId={invoiceId} />;
}
