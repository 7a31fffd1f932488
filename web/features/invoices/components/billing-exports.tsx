import { useId } from 'react';
import { useWatch } from 'react-hook-form';
import { billingExportQuery } from '@shared/schemas/billing';
import { Form, useZodForm } from '../../../components/form';
import { TextField } from '../../../components/form-fields';
import { dayIn } from '../../../lib/format';
import { billingExportUrl } from '../api/export-billing';

type RangeValues = { from: string; to: string };

const linkClass =
  'inline-flex min-h-11 items-center justify-center rounded-lg border border-ink-300 bg-white px-4 font-bold text-ink-900 no-underline hover:bg-ink-50';

/**
 * The accountant's downloads: every invoice and credit note issued, or every payment received,
 * between two days. Plain links, so the browser downloads the file; a range that cannot be read
 * stops the link and says why under the dates.
 */
export function BillingExports() {
  const id = useId();
  const form = useZodForm(billingExportQuery, {
    defaultValues: {
      from: `${dayIn(new Date()).slice(0, 8)}01`,
      to: dayIn(new Date()),
    } satisfies RangeValues,
  });
  const range = useWatch({ control: form.control }) as Partial<RangeValues>;
  const parsed = billingExportQuery.safeParse(range);
  const href = (what: 'invoices' | 'payments') =>
    parsed.success
      ? billingExportUrl(what, parsed.data)
      : billingExportUrl(what, { from: range.from ?? '', to: range.to ?? '' });
  const stopIfUnreadable = (event: React.MouseEvent) => {
    if (parsed.success) return;
    event.preventDefault();
    void form.trigger();
  };
  return (
    <section aria-labelledby={id} className="rounded-card bg-white p-4 shadow-card">
      <h2 id={id} className="font-bold text-ink-900">
        Downloads for your accounts
      </h2>
      <p className="mt-1 text-sm text-ink-700">CSV files, by the day issued or the day received.</p>
      <Form
        form={form}
        onSubmit={() => undefined}
        aria-labelledby={id}
        className="mt-3 grid gap-3 sm:grid-cols-2"
      >
        <TextField<RangeValues> name="from" label="From" type="date" />
        <TextField<RangeValues> name="to" label="To" type="date" />
      </Form>
      <div className="mt-3 flex flex-wrap gap-2">
        <a href={href('invoices')} download onClick={stopIfUnreadable} className={linkClass}>
          Download invoices CSV
        </a>
        <a href={href('payments')} download onClick={stopIfUnreadable} className={linkClass}>
          Download payments CSV
        </a>
      </div>
    </section>
  );
}
