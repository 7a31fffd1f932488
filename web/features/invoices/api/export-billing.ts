/** Plain links: the browser downloads the CSV with the session cookie. */
export function billingExportUrl(what: 'invoices' | 'payments', range: { from: string; to: string }): string {
  const search = new URLSearchParams({ from: range.from, to: range.to });
  return `/api/${what}/export.csv?${search}`;
}
