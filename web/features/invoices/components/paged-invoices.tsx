import { useEffect, useRef, type ReactNode } from 'react';
import { ErrorState, LoadingState } from '../../../components/states';
import { formatCount } from '../../../lib/format';
import type { useInvoiceList } from '../api/list-invoices';
import { invoicePath, type InvoiceAudience } from './invoice-document';
import { InvoiceTable } from './invoice-table';

const moreClass =
  'inline-flex min-h-11 items-center justify-center rounded-lg border-2 border-brine-700 bg-white px-4 font-bold text-brine-700 hover:bg-brine-100 aria-disabled:cursor-wait aria-disabled:opacity-70';

/**
 * A list read page by page: loading, error and empty states, then the documents and a "Show more"
 * button (not endless scrolling: a keyboard or a screen reader can reach the end), which takes focus
 * to the first document it brought.
 */
export function PagedInvoices({
  list,
  audience,
  empty,
}: {
  list: ReturnType<typeof useInvoiceList>;
  audience: InvoiceAudience;
  empty: ReactNode;
}) {
  const box = useRef<HTMLDivElement>(null);
  const focusFrom = useRef<number | null>(null);
  const data = list.data;

  const showMore = () => {
    focusFrom.current = data?.items.length ?? null;
    void list.fetchNextPage();
  };
  useEffect(() => {
    const item = focusFrom.current === null ? undefined : data?.items[focusFrom.current];
    if (!item || !box.current) return;
    focusFrom.current = null;
    const links = box.current.querySelectorAll<HTMLAnchorElement>(
      `a[href="${invoicePath(audience, item.id)}"]`,
    );
    // The phone's cards and the desk's table are both in the page; only one is shown.
    [...links].find((link) => link.offsetParent !== null)?.focus();
  }, [data, audience]);

  if (list.isPending) return <LoadingState label="Loading invoices…" />;
  if (list.isError && !data)
    return <ErrorState error={list.error} what="the invoices" onRetry={() => void list.refetch()} />;
  if (!data || data.items.length === 0) return <>{empty}</>;
  return (
    <div ref={box}>
      <p className="mb-3 text-sm text-ink-700" role="status">
        {data.complete
          ? `${formatCount(data.items.length)} ${data.items.length === 1 ? 'document' : 'documents'}, newest first`
          : `Showing the newest ${formatCount(data.items.length)}`}
      </p>
      <InvoiceTable items={data.items} audience={audience} />
      {list.isFetchNextPageError && (
        <div className="mt-3">
          <ErrorState error={list.error} what="more invoices" onRetry={showMore} />
        </div>
      )}
      {list.hasNextPage && !list.isFetchNextPageError && (
        <div className="mt-4 flex justify-center">
          <button
            type="button"
            className={moreClass}
            aria-disabled={list.isFetchingNextPage || undefined}
            onClick={() => {
              if (!list.isFetchingNextPage) showMore();
            }}
          >
            {list.isFetchingNextPage ? 'Loading more…' : 'Show more'}
          </button>
        </div>
      )}
    </div>
  );
}
