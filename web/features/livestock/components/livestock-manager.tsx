import { useState } from 'react';
import { z } from 'zod';
import { livestockStatusLabels, updateLivestockInput, type LivestockItem } from '@shared/schemas/livestock';
import { livestockStatuses } from '@shared/schemas/livestock-status';
import { Button } from '../../../components/button';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { SelectField, TextAreaField, TextField } from '../../../components/form-fields';
import { PhotoUploader } from '../../../components/photo-uploader';
import { blankAsNull, decimalDefault, decimalText } from '../../../lib/form-values';
import { problemMessage } from '../../../lib/problem-message';
import { capitalise, formatDate } from '../../../lib/format';
import { useDeleteLivestock } from '../api/delete-livestock';
import { useUpdateLivestock } from '../api/update-livestock';
import { displayName, hazardOf } from './livestock-gallery';
import { HandlingCaution } from './handling-caution';
import { LivestockPicture } from './livestock-picture';
import { LivestockStatusBadge } from './livestock-status-badge';

const fields = updateLivestockInput.shape;
const changeForm = z.object({
  status: fields.status.unwrap(),
  statusNote: blankAsNull(fields.statusNote),
  quantity: decimalText(fields.quantity.unwrap()),
  nickname: blankAsNull(fields.nickname),
  placement: blankAsNull(fields.placement),
});
type ChangeFormValues = z.input<typeof changeForm>;

function ChangeForm({ tankId, item, onDone }: { tankId: string; item: LivestockItem; onDone: () => void }) {
  const update = useUpdateLivestock(tankId);
  const form = useZodForm(changeForm, {
    defaultValues: {
      status: item.status,
      statusNote: '',
      quantity: decimalDefault(item.quantity),
      nickname: item.nickname ?? '',
      placement: item.placement ?? '',
    },
  });

  return (
    <Form
      form={form}
      className="mt-3 space-y-3 rounded-lg bg-ink-50 p-3"
      aria-label={`Update ${displayName(item)}`}
      onSubmit={async ({ status, statusNote, ...rest }) => {
        // Only a new condition or a note goes into the history.
        const statusChanged = status !== item.status || statusNote !== null;
        await update.mutateAsync({
          livestockId: item.id,
          input: { ...rest, ...(statusChanged ? { status, statusNote } : {}) },
        });
        onDone();
      }}
    >
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField<ChangeFormValues>
          name="status"
          label="Condition"
          options={livestockStatuses.map((value) => ({ value, label: livestockStatusLabels[value] }))}
          hint="Removed: it left the tank. The history is kept."
        />
        <TextField<ChangeFormValues> name="quantity" label="How many" inputMode="numeric" />
        <TextField<ChangeFormValues> name="nickname" label="Nickname" maxLength={80} />
        <TextField<ChangeFormValues> name="placement" label="Where in the tank" maxLength={120} />
      </div>
      <TextAreaField<ChangeFormValues>
        name="statusNote"
        label="What you saw (kept in the history)"
        rows={2}
        maxLength={500}
      />
      <FormProblem className="text-sm" />
      <div className="flex flex-wrap gap-2">
        <SubmitButton pending="Saving…">Save</SubmitButton>
        <Button tone="secondary" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </Form>
  );
}

function ManagedItem({ tankId, item, timeZone }: { tankId: string; item: LivestockItem; timeZone: string }) {
  const [mode, setMode] = useState<'view' | 'change' | 'photo'>('view');
  const [confirming, setConfirming] = useState(false);
  const remove = useDeleteLivestock(tankId);
  const name = displayName(item);
  const hazard = hazardOf(item);
  const latest = item.history[0];
  return (
    <li className="rounded-card bg-white p-4 shadow-card">
      <div className="flex gap-3">
        <div className="h-20 w-24 shrink-0 overflow-hidden rounded-lg">
          <LivestockPicture
            photo={item.photos.at(-1)}
            group={item.species.profile.group}
            alt={`Photo of the ${item.species.commonName}`}
          />
        </div>
        <div className="min-w-0 flex-1">
          <div className="flex flex-wrap items-start justify-between gap-2">
            <div className="min-w-0">
              <h3 className="font-bold text-ink-950">
                {name}
                {item.quantity > 1 && <span className="font-normal text-ink-700"> × {item.quantity}</span>}
              </h3>
              <p className="text-sm text-ink-700">
                {item.nickname && `${capitalise(item.species.commonName)} · `}
                <i>{item.species.scientificName}</i>
              </p>
            </div>
            <LivestockStatusBadge status={item.status} />
          </div>
          {latest && (
            <p className="mt-1 text-sm text-ink-700">
              {formatDate(latest.changedAt, timeZone)}
              {latest.note && `: ${latest.note}`}
            </p>
          )}
        </div>
      </div>
      {hazard && (
        <div className="mt-3">
          <HandlingCaution hazard={hazard} compact />
        </div>
      )}
      {mode === 'view' && (
        <div className="mt-3 flex flex-wrap gap-2">
          <Button tone="secondary" onClick={() => setMode('change')}>
            Update<span className="sr-only"> {name}</span>
          </Button>
          <Button tone="secondary" onClick={() => setMode('photo')}>
            Add photo<span className="sr-only"> of {name}</span>
          </Button>
          <Button
            tone="secondary"
            className="text-alert-700"
            disabled={remove.isPending}
            onClick={() => {
              remove.reset();
              setConfirming(true);
            }}
          >
            Delete entry<span className="sr-only"> for {name}</span>
          </Button>
          <ConfirmDialog
            open={confirming}
            title={`Delete the entry for ${name}?`}
            confirmLabel="Delete entry"
            pendingLabel="Deleting…"
            pending={remove.isPending}
            error={remove.isError ? problemMessage(remove.error) : undefined}
            onClose={() => setConfirming(false)}
            onConfirm={() => remove.mutate(item.id, { onSuccess: () => setConfirming(false) })}
          >
            <p>
              Deleting is for an entry made by mistake. If it left the tank, set its condition to “Removed”
              instead, which keeps its history.
            </p>
          </ConfirmDialog>
        </div>
      )}
      {mode === 'change' && <ChangeForm tankId={tankId} item={item} onDone={() => setMode('view')} />}
      {mode === 'photo' && (
        <div className="mt-3 space-y-2 rounded-lg bg-ink-50 p-3">
          <PhotoUploader tankId={tankId} livestockId={item.id} label={`Photo of ${name}`} />
          <Button tone="secondary" onClick={() => setMode('view')}>
            Done
          </Button>
        </div>
      )}
    </li>
  );
}

/** Staff's list of what lives in the tank, with condition changes, photos and corrections. */
export function LivestockManager({
  tankId,
  livestock,
  timeZone,
}: {
  tankId: string;
  livestock: readonly LivestockItem[];
  timeZone: string;
}) {
  if (livestock.length === 0) {
    return (
      <p className="rounded-card border border-dashed border-ink-300 bg-white p-5 text-sm text-ink-700">
        Nothing recorded yet.
      </p>
    );
  }
  return (
    <ul className="space-y-3">
      {livestock.map((item) => (
        <ManagedItem key={item.id} tankId={tankId} item={item} timeZone={timeZone} />
      ))}
    </ul>
  );
}
