import { useState } from 'react';
import { useFormContext } from 'react-hook-form';
import { z } from 'zod';
import {
  urgentMoveInput,
  type UrgentMoveInput,
  type UrgentRequestView,
} from '@shared/schemas/urgent-requests';
import { urgentTransitions, urgentStatusNames, type UrgentStatus } from '@shared/urgent/lifecycle';
import { Button } from '../../../components/button';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { SelectField, TextAreaField, TextField } from '../../../components/form-fields';
import { SheetDialog } from '../../../components/sheet-dialog';
import { ApiError } from '../../../lib/api-client';
import { formatDateTime } from '../../../lib/format';
import { useTechnicians } from '../../../lib/queries/technicians';
import { useMoveUrgentRequest } from '../api/move-urgent-request';
import { wallInstantText, wallText, zoneName } from '../utils/wall-clock';

type Move = Exclude<UrgentStatus, 'requested'>;

const actions: Readonly<Record<Move, { label: string; title: string; submit: string }>> = {
  acknowledged: { label: 'Acknowledge', title: 'Acknowledge the request', submit: 'Acknowledge' },
  assigned: { label: 'Assign technician', title: 'Assign a technician', submit: 'Assign' },
  'on-the-way': { label: 'On the way', title: 'On the way', submit: 'Say we are on the way' },
  'on-site': { label: 'On site', title: 'On site', submit: 'Say we are on site' },
  resolved: { label: 'Resolve', title: 'Resolve the request', submit: 'Resolve' },
  declined: { label: 'Decline', title: 'Decline the request', submit: 'Decline' },
};

const note = z.string();

/**
 * Each move's form: what staff type (arrival times on the tank's wall clock), turned into the move
 * and checked by the shared `urgentMoveInput`, so the rules are the API's own.
 */
function moveFormSchema(to: Move, zone: string) {
  const fields = {
    acknowledged: { eta: wallInstantText(zone, { required: true }), note },
    assigned: { technicianId: z.string(), eta: wallInstantText(zone, { required: false }), note },
    'on-the-way': { eta: wallInstantText(zone, { required: false }), note },
    'on-site': { note },
    resolved: { note },
    declined: { reason: z.string(), advice: z.string() },
  }[to];
  return z
    .object(fields)
    .transform((values) => ({ to, ...values }) as UrgentMoveInput)
    .pipe(urgentMoveInput);
}

type MoveFormValues = {
  eta?: string;
  note?: string;
  technicianId?: string;
  reason?: string;
  advice?: string;
};

const minuteMs = 60_000;
const quickPicks = [
  { label: '+30 min', minutes: 30 },
  { label: '+1 h', minutes: 60 },
  { label: '+2 h', minutes: 120 },
];

/** An arrival time on the tank's clock, with one-tap picks from now. */
function EtaField({ zone, required }: { zone: string; required: boolean }) {
  const { setValue, formState } = useFormContext<MoveFormValues>();
  return (
    <div className="grid gap-2">
      <TextField<MoveFormValues>
        name="eta"
        label={required ? 'Expected arrival' : 'Expected arrival (optional)'}
        hint={`On the tank’s clock (${zoneName(zone)}).`}
        type="datetime-local"
      />
      <div className="flex flex-wrap gap-2" role="group" aria-label="Quick picks for the arrival time">
        {quickPicks.map((pick) => (
          <Button
            key={pick.label}
            tone="secondary"
            onClick={() =>
              setValue('eta', wallText(new Date(Date.now() + pick.minutes * minuteMs), zone), {
                shouldDirty: true,
                shouldValidate: formState.isSubmitted,
              })
            }
          >
            <span className="sr-only">Arrival in </span>
            {pick.label}
          </Button>
        ))}
      </div>
    </div>
  );
}

function MoveForm({
  request,
  to,
  meId,
  onDone,
  onConflict,
  onCancel,
}: {
  request: UrgentRequestView;
  to: Move;
  meId: string | null;
  onDone: () => void;
  onConflict: () => void;
  onCancel: () => void;
}) {
  const zone = request.timeZone;
  const move = useMoveUrgentRequest(request.id);
  const technicians = useTechnicians();
  const form = useZodForm(moveFormSchema(to, zone), {
    defaultValues: {
      eta: request.eta && to !== 'acknowledged' ? wallText(request.eta, zone) : '',
      note: '',
      technicianId: request.technician?.id ?? meId ?? '',
      reason: '',
      advice: '',
    } as MoveFormValues,
  });
  return (
    <Form
      form={form}
      aria-label={actions[to].title}
      className="grid gap-4"
      onSubmit={async (values) => {
        try {
          await move.mutateAsync(values);
        } catch (error) {
          if (error instanceof ApiError && error.status === 409 && error.code === 'invalid_transition') {
            onConflict();
            return;
          }
          throw error;
        }
        onDone();
      }}
    >
      {to === 'assigned' && (
        <SelectField<MoveFormValues>
          name="technicianId"
          label="Technician"
          disabled={technicians.isPending}
          hint={technicians.isError ? 'The staff list could not be loaded. Close and try again.' : undefined}
          options={[
            { value: '', label: technicians.isPending ? 'Loading the staff…' : 'Choose who goes' },
            ...(technicians.data ?? []).map((person) => ({
              value: person.id,
              label: person.id === meId ? `${person.name} (you)` : person.name,
            })),
          ]}
        />
      )}
      {(to === 'acknowledged' || to === 'assigned' || to === 'on-the-way') && (
        <EtaField zone={zone} required={to === 'acknowledged'} />
      )}
      {to === 'declined' ? (
        <>
          <TextAreaField<MoveFormValues>
            name="reason"
            label="Why we cannot come"
            hint="The owner sees this."
            rows={3}
            maxLength={1000}
            required
          />
          <TextAreaField<MoveFormValues>
            name="advice"
            label="What the owner should do instead"
            hint="Shown prominently on the owner’s page."
            rows={4}
            maxLength={2000}
            required
          />
        </>
      ) : (
        <TextAreaField<MoveFormValues>
          name="note"
          label="Note (optional)"
          hint="The owner sees it in the request’s history."
          rows={2}
          maxLength={1000}
        />
      )}
      <FormProblem />
      <div className="flex flex-col-reverse gap-2 sm:flex-row sm:justify-end">
        <Button tone="secondary" onClick={onCancel}>
          Cancel
        </Button>
        <SubmitButton pending="Saving…" tone={to === 'declined' ? 'danger' : 'primary'}>
          {actions[to].submit}
        </SubmitButton>
      </div>
    </Form>
  );
}

/**
 * What staff can do next, only the moves allowed from the current status. When someone else moved
 * the request first, the page shows the latest and says so rather than failing quietly.
 */
export function UrgentActions({
  request,
  meId,
  onConflict,
}: {
  request: UrgentRequestView;
  meId: string | null;
  onConflict: () => void;
}) {
  const [open, setOpen] = useState<Move | null>(null);
  const moves = urgentTransitions[request.status].filter((to): to is Move => to !== 'requested');
  if (moves.length === 0) return null;
  return (
    <section aria-labelledby="urgent-actions-title" className="rounded-card bg-white p-4 shadow-card sm:p-6">
      <h2 id="urgent-actions-title" className="text-lg font-bold text-ink-900">
        Next step
      </h2>
      <p className="mt-1 text-sm text-ink-700">
        Now {urgentStatusNames[request.status].toLowerCase()}
        {request.eta && (
          <>
            {' '}
            · arrival expected{' '}
            <time dateTime={request.eta}>{formatDateTime(request.eta, request.timeZone)}</time>
          </>
        )}
        .
      </p>
      <div className="mt-3 flex flex-wrap gap-2">
        {moves.map((to) => (
          <Button key={to} tone={to === 'declined' ? 'secondary' : 'primary'} onClick={() => setOpen(to)}>
            {/* Coloured inside: beside the tone's own text colour a class on the button would lose. */}
            <span className={to === 'declined' ? 'text-alert-700' : undefined}>
              {to === 'assigned' && request.technician ? 'Reassign technician' : actions[to].label}
            </span>
          </Button>
        ))}
      </div>
      {open && (
        <SheetDialog title={actions[open].title} onClose={() => setOpen(null)}>
          <MoveForm
            request={request}
            to={open}
            meId={meId}
            onDone={() => setOpen(null)}
            onCancel={() => setOpen(null)}
            onConflict={() => {
              setOpen(null);
              onConflict();
            }}
          />
        </SheetDialog>
      )}
    </section>
  );
}
