import { invoicePdfUrl } from '../api/get-invoice';

/** The document as a PDF, downloaded by the browser (a plain link, so it also opens in a new tab). */
export function PdfLink({ invoiceId }: { invoiceId: string }) {
  return (
    <a
      href={invoicePdfUrl(invoiceId)}
      download
      className="inline-flex min-h-11 items-center rounded-lg border border-ink-300 bg-white px-4 font-bold text-ink-900 no-underline hover:bg-ink-50"
    >
      Download PDF
    </a>
  );
}
