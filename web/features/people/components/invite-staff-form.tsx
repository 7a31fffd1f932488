import { useState } from 'react';
import { z } from 'zod';
import { createInvitationInput } from '@shared/schemas/invitations';
import { staffRole } from '@shared/schemas/users';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { RadioGroupField, TextField } from '../../../components/form-fields';
import { blankAsUndefined } from '../../../lib/form-values';
import { useCreateInvitation, type CreatedInvitation } from '../api/create-invitation';
import { InvitationOutcome } from './invitation-outcome';

const roleChoices = [
  {
    value: 'technician',
    label: 'Technician',
    hint: 'Records visits and readings, and sees every client tank.',
  },
  { value: 'admin', label: 'Admin', hint: 'Also manages staff, clients and invitations.' },
] as const;

const staffInvitation = createInvitationInput.options[0];
const inviteStaffForm = z.object({
  role: staffRole,
  email: staffInvitation.shape.email,
  name: blankAsUndefined(staffInvitation.shape.name),
});

export function InviteStaffForm({ className = '' }: { className?: string }) {
  const invite = useCreateInvitation();
  const [outcome, setOutcome] = useState<CreatedInvitation | null>(null);
  const form = useZodForm(inviteStaffForm, { defaultValues: { role: 'technician', email: '', name: '' } });

  return (
    <section
      aria-labelledby="invite-staff-title"
      className={`rounded-card bg-white p-5 shadow-card ${className}`}
    >
      <h2 id="invite-staff-title" className="text-xl font-bold text-ink-900">
        Invite a staff member
      </h2>
      <p className="mt-1 text-sm text-ink-700">
        They get an e-mail with a link that works once. The invitation expires if it is not used.
      </p>
      <Form
        form={form}
        className="mt-4 grid gap-4"
        onSubmit={async (values) => {
          setOutcome(null);
          setOutcome(await invite.mutateAsync(values));
          form.reset();
        }}
      >
        <TextField name="email" label="E-mail address" type="email" autoComplete="off" spellCheck={false} />
        <TextField
          name="name"
          label="Name (optional)"
          hint="Used to greet them in the e-mail."
          autoComplete="off"
        />
        <RadioGroupField name="role" label="Role" look="rows" options={roleChoices} />
        <InvitationOutcome outcome={outcome} />
        <FormProblem />
        <SubmitButton pending="Sending invitation…">Send invitation</SubmitButton>
      </Form>
    </section>
  );
}
