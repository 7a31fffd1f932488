import { useState } from 'react';
import { priceItemKindLabels, type PriceItemKind } from '@shared/billing/invoices';
import { formatMoney } from '@shared/billing/money';
import type { PriceItemView } from '@shared/schemas/billing';
import { Button } from '../../../components/button';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { DecimalField, TextField } from '../../../components/form-fields';
import { SheetDialog } from '../../../components/sheet-dialog';
import { ApiError } from '../../../lib/api-client';
import { problemMessage } from '../../../lib/problem-message';
import { useArchivePriceItem } from '../api/archive-price-item';
import { useCreatePriceItem } from '../api/create-price-item';
import { useUpdatePriceItem } from '../api/update-price-item';
import {
  bandSize,
  itemsOfKind,
  newPriceItemValues,
  priceItemFormSchema,
  priceItemValues,
  type PriceItemFormValues,
} from '../utils/price-list-forms';

interface Group {
  kind: PriceItemKind;
  title: string;
  hint: string;
  add: string;
  none: string;
  nameHint: string;
  unitHint: string;
}

const groups: readonly Group[] = [
  {
    kind: 'routine',
    title: 'Routine service by tank size',
    hint: 'One price per visit for each size band. A tank is charged the smallest band its system volume (display and sump) fits; the band without a size covers anything larger.',
    add: 'Add a band',
    none: 'No bands yet.',
    nameHint: 'As invoices print it, such as “Routine service, small system”.',
    unitHint: 'What one is, usually “visit”.',
  },
  {
    kind: 'consumable',
    title: 'Consumables',
    hint: 'Used up on a visit and charged by the unit: salt mix by the bag, filter socks, filter media, epoxy.',
    add: 'Add a consumable',
    none: 'No consumables yet.',
    nameHint: 'Such as “Reef salt mix, 20 kg” or “Filter sock, 100 micron”. No brand needed.',
    unitHint: 'What one is: bag, sock, litre, stick…',
  },
  {
    kind: 'part',
    title: 'Parts',
    hint: 'Fitted on a visit and charged each: heaters, impellers, float switches, tubing.',
    add: 'Add a part',
    none: 'No parts yet.',
    nameHint: 'Such as “Heater, 150 W” or “Return pump impeller”.',
    unitHint: 'What one is: each, metre…',
  },
];

const groupOf = (kind: PriceItemKind) => groups.find((group) => group.kind === kind)!;

/** Add or change one item in a sheet; its kind is the group it was opened from. */
function ItemEditor({
  kind,
  currency,
  item,
  onClose,
}: {
  kind: PriceItemKind;
  currency: string;
  item: PriceItemView | null;
  onClose: () => void;
}) {
  const group = groupOf(kind);
  const create = useCreatePriceItem();
  const update = useUpdatePriceItem();
  const form = useZodForm(priceItemFormSchema(kind, currency), {
    defaultValues: item ? priceItemValues(item, currency) : newPriceItemValues(kind),
  });
  return (
    <SheetDialog title={item ? `Change “${item.name}”` : group.add} onClose={onClose}>
      <Form
        form={form}
        className="grid gap-4"
        onSubmit={async (input) => {
          try {
            if (item) await update.mutateAsync({ priceItemId: item.id, input });
            else await create.mutateAsync(input);
          } catch (error) {
            if (error instanceof ApiError && error.status === 409 && error.code === 'band_taken') {
              form.setError('upToLitres', { type: 'server', message: error.message }, { shouldFocus: true });
              return;
            }
            throw error;
          }
          onClose();
        }}
      >
        <TextField<PriceItemFormValues> name="name" label="Name" hint={group.nameHint} maxLength={120} />
        {kind === 'routine' && (
          <DecimalField<PriceItemFormValues>
            name="upToLitres"
            label="For systems up to"
            hint="Display and sump together. Leave blank for the band that covers every larger system."
            inputMode="numeric"
            suffix="litres"
          />
        )}
        <div className="grid grid-cols-2 gap-3">
          <TextField<PriceItemFormValues> name="unit" label="Unit" hint={group.unitHint} maxLength={30} />
          <DecimalField<PriceItemFormValues>
            name="unitPrice"
            label="Price per unit"
            hint={`In ${currency}.`}
            suffix={currency}
          />
        </div>
        <FormProblem />
        <div className="flex flex-col-reverse gap-2 sm:flex-row sm:justify-end">
          <Button tone="secondary" onClick={onClose}>
            Cancel
          </Button>
          <SubmitButton pending="Saving…">{item ? 'Save' : group.add}</SubmitButton>
        </div>
      </Form>
    </SheetDialog>
  );
}

function ItemRow({ item, currency, onEdit }: { item: PriceItemView; currency: string; onEdit: () => void }) {
  const archive = useArchivePriceItem();
  const [confirming, setConfirming] = useState(false);
  return (
    <li className="flex flex-wrap items-center justify-between gap-x-4 gap-y-2 py-3">
      <div className="min-w-0 flex-1">
        <p className="font-bold break-words text-ink-950">{item.name}</p>
        <p className="text-sm text-ink-700">
          {item.kind === 'routine' ? `${bandSize(item.upToLitres)} · ` : ''}
          <span className="font-bold text-ink-900 tabular-nums">
            {formatMoney(item.unitPriceMinor, currency)}
          </span>{' '}
          per {item.unit}
        </p>
      </div>
      <div className="flex gap-2">
        <Button tone="secondary" onClick={onEdit}>
          Edit<span className="sr-only"> {item.name}</span>
        </Button>
        <Button
          tone="secondary"
          onClick={() => {
            archive.reset();
            setConfirming(true);
          }}
        >
          {/* Coloured inside: beside the tone's own text colour a class on the button would lose. */}
          <span className="text-alert-700">
            Archive<span className="sr-only"> {item.name}</span>
          </span>
        </Button>
      </div>
      <ConfirmDialog
        open={confirming}
        title={`Archive “${item.name}”?`}
        confirmLabel="Archive"
        pendingLabel="Archiving…"
        pending={archive.isPending}
        error={archive.isError ? problemMessage(archive.error) : undefined}
        onClose={() => setConfirming(false)}
        onConfirm={() => archive.mutate(item.id, { onSuccess: () => setConfirming(false) })}
      >
        <p>
          It leaves the price list and can no longer be chosen on visit reports or invoices. Reports and
          invoices that already name it keep it.
        </p>
      </ConfirmDialog>
    </li>
  );
}

type Editing = { kind: PriceItemKind; item: PriceItemView | null } | null;

/** The price list's three groups, each with its items and a way to add one. */
export function PriceItems({ items, currency }: { items: readonly PriceItemView[]; currency: string }) {
  const [editing, setEditing] = useState<Editing>(null);
  const archived = items.filter((item) => item.archived);
  return (
    <div className="grid grid-cols-[minmax(0,1fr)] gap-4">
      {groups.map((group) => {
        const list = itemsOfKind(items, group.kind);
        const titleId = `price-group-${group.kind}`;
        return (
          <section
            key={group.kind}
            aria-labelledby={titleId}
            className="min-w-0 rounded-card bg-white p-4 shadow-card sm:p-6"
          >
            <div className="flex flex-wrap items-start justify-between gap-2">
              <h2 id={titleId} className="text-lg font-bold text-ink-900">
                {group.title}
              </h2>
              <Button tone="secondary" onClick={() => setEditing({ kind: group.kind, item: null })}>
                {group.add}
              </Button>
            </div>
            <p className="mt-1 text-sm text-ink-700">{group.hint}</p>
            {list.length === 0 ? (
              <p className="mt-3 text-ink-700">{group.none}</p>
            ) : (
              <ul className="mt-2 divide-y divide-ink-100">
                {list.map((item) => (
                  <ItemRow
                    key={item.id}
                    item={item}
                    currency={currency}
                    onEdit={() => setEditing({ kind: item.kind, item })}
                  />
                ))}
              </ul>
            )}
          </section>
        );
      })}
      {archived.length > 0 && (
        <details className="rounded-card bg-white p-4 shadow-card sm:p-6">
          <summary className="flex min-h-11 cursor-pointer items-center font-bold text-brine-700">
            Archived items ({archived.length})
          </summary>
          <p className="mt-1 text-sm text-ink-700">
            No longer offered; kept so that earlier reports and invoices still name them.
          </p>
          <ul className="mt-2 divide-y divide-ink-100">
            {archived.map((item) => (
              <li key={item.id} className="py-2">
                <span className="font-bold text-ink-900">{item.name}</span>
                <span className="text-sm text-ink-700">
                  {' '}
                  · {priceItemKindLabels[item.kind]} · {formatMoney(item.unitPriceMinor, currency)} per{' '}
                  {item.unit}
                </span>
              </li>
            ))}
          </ul>
        </details>
      )}
      {editing && (
        <ItemEditor
          kind={editing.kind}
          currency={currency}
          item={editing.item}
          onClose={() => setEditing(null)}
        />
      )}
    </div>
  );
}
