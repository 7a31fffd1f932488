import { useId } from 'react';
import { useFieldArray, useFormContext, useWatch } from 'react-hook-form';
import { invoiceLineKindLabels, invoiceLineKinds } from '@shared/billing/invoices';
import { formatMoney } from '@shared/billing/money';
import { Button } from '../../../components/button';
import { FieldError } from '../../../components/field-error';
import { DecimalField, SelectField, TextField } from '../../../components/form-fields';
import { blankLine, previewTotals, type LineFormValues, type TaxTerms } from '../utils/invoice-form';
import { taxLine } from '../utils/invoice-text';

type LinesForm = { lines: LineFormValues[] };

const kindOptions = invoiceLineKinds.map((kind) => ({ value: kind, label: invoiceLineKindLabels[kind] }));

/** The preview under the lines: worked out by the shared functions the server uses, which recomputes anyway. */
function TotalsPreview({
  terms,
  lines,
  credit,
}: {
  terms: TaxTerms;
  lines: LineFormValues[];
  credit: boolean;
}) {
  const id = useId();
  const { totals, leftOut } = previewTotals(lines, terms);
  const money = (minor: number) => formatMoney(minor, terms.currency);
  const tax = taxLine(terms.taxLabel, terms.taxRateBp);
  return (
    <section aria-labelledby={id} className="rounded-lg bg-sand-100 p-3">
      <h3 id={id} className="font-bold text-ink-900">
        {credit ? 'Taken back' : 'Totals'} (preview)
      </h3>
      <dl className="mt-1 grid gap-1">
        <div className="flex justify-between gap-4">
          <dt className="text-ink-700">{terms.pricesIncludeTax ? 'Net (before tax)' : 'Net'}</dt>
          <dd className="tabular-nums">{money(totals.netMinor)}</dd>
        </div>
        <div className="flex justify-between gap-4">
          <dt className="text-ink-700">{tax}</dt>
          <dd className="tabular-nums">{money(totals.taxMinor)}</dd>
        </div>
        <div className="flex justify-between gap-4 border-t-2 border-ink-300 pt-1 text-lg font-bold">
          <dt>Total</dt>
          <dd className="tabular-nums">{money(totals.totalMinor)}</dd>
        </div>
      </dl>
      {leftOut > 0 && (
        <p className="mt-1 text-sm text-ink-700">
          {leftOut === 1 ? 'One line is' : `${leftOut} lines are`} left out until its quantity and price read
          as numbers.
        </p>
      )}
      {terms.pricesIncludeTax && <p className="mt-1 text-sm text-ink-700">Prices include {tax}.</p>}
    </section>
  );
}

/**
 * An invoice's or credit note's lines in a form: kind, description, quantity, unit and unit price as
 * typed, each line's amount and the totals worked out as they are typed. At least one line stays.
 */
export function InvoiceLinesFields({ terms, credit = false }: { terms: TaxTerms; credit?: boolean }) {
  const { fields, append, remove } = useFieldArray<LinesForm, 'lines'>({ name: 'lines' });
  const lines = useWatch<LinesForm, 'lines'>({ name: 'lines' });
  const {
    formState: { errors },
  } = useFormContext<LinesForm>();
  const { amounts } = previewTotals(lines, terms);
  const listError = errors.lines?.root?.message ?? errors.lines?.message;
  return (
    <div className="grid gap-3">
      <ol className="grid gap-3">
        {fields.map((field, index) => {
          const amount = amounts[index];
          return (
            <li key={field.id}>
              <fieldset className="grid min-w-0 grid-cols-2 gap-3 rounded-lg border border-ink-100 p-3 sm:grid-cols-6">
                <legend className="px-1 font-bold text-ink-900">Line {index + 1}</legend>
                <TextField<LinesForm>
                  name={`lines.${index}.description`}
                  label="Description"
                  maxLength={300}
                  className="col-span-2 sm:col-span-4"
                />
                <SelectField<LinesForm>
                  name={`lines.${index}.kind`}
                  label="Kind"
                  options={kindOptions}
                  className="col-span-2"
                />
                <DecimalField<LinesForm>
                  name={`lines.${index}.quantity`}
                  label="Quantity"
                  className="sm:col-span-1"
                />
                <TextField<LinesForm>
                  name={`lines.${index}.unit`}
                  label="Unit"
                  maxLength={30}
                  className="sm:col-span-2"
                />
                <DecimalField<LinesForm>
                  name={`lines.${index}.unitPrice`}
                  label="Unit price"
                  suffix={terms.currency}
                  className="sm:col-span-2"
                />
                <div className="min-w-0 sm:col-span-1">
                  <p className="font-bold text-ink-900">Amount</p>
                  <p className="mt-1 flex min-h-12 items-center tabular-nums">
                    {amount === null || amount === undefined ? '—' : formatMoney(amount, terms.currency)}
                  </p>
                </div>
                <div className="col-span-2 sm:col-span-6">
                  <Button tone="secondary" onClick={() => remove(index)} disabled={fields.length === 1}>
                    Remove line {index + 1}
                  </Button>
                </div>
              </fieldset>
            </li>
          );
        })}
      </ol>
      {listError && <FieldError className="">{String(listError)}</FieldError>}
      <div>
        <Button
          tone="secondary"
          onClick={() => append(blankLine(credit ? 'other' : 'service'))}
          disabled={fields.length >= 100}
        >
          Add a line
        </Button>
      </div>
      <TotalsPreview terms={terms} lines={lines} credit={credit} />
    </div>
  );
}
