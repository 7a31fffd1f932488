import { useState } from 'react';
import { z } from 'zod';
import { createInvitationInput } from '@shared/schemas/invitations';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { TextField } from '../../../components/form-fields';
import { blankAsUndefined } from '../../../lib/form-values';
import { useCreateInvitation, type CreatedInvitation } from '../api/create-invitation';
import { InvitationOutcome } from './invitation-outcome';
import { TankField } from './tank-field';

const clientInvitation = createInvitationInput.options[1];
const inviteClientForm = z.object({
  email: clientInvitation.shape.email,
  name: blankAsUndefined(clientInvitation.shape.name),
  tankId: clientInvitation.shape.tankId,
});

export function InviteClientForm({ className = '' }: { className?: string }) {
  const invite = useCreateInvitation();
  const [outcome, setOutcome] = useState<CreatedInvitation | null>(null);
  const form = useZodForm(inviteClientForm, { defaultValues: { email: '', name: '', tankId: '' } });

  return (
    <section
      aria-labelledby="invite-client-title"
      className={`rounded-card bg-white p-5 shadow-card ${className}`}
    >
      <h2 id="invite-client-title" className="text-xl font-bold text-ink-900">
        Invite a client
      </h2>
      <p className="mt-1 text-sm text-ink-700">
        The owner of a tank gets an e-mail with a link that works once. Invite each person who should follow
        the tank.
      </p>
      <Form
        form={form}
        className="mt-4 grid gap-4"
        onSubmit={async (values) => {
          setOutcome(null);
          setOutcome(await invite.mutateAsync({ role: 'owner', ...values }));
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
        <TankField name="tankId" />
        <InvitationOutcome outcome={outcome} />
        <FormProblem />
        <SubmitButton pending="Sending invitation…">Send invitation</SubmitButton>
      </Form>
    </section>
  );
}
