import { useState } from 'react';
import { Button } from '../../../components/button';
import { TextField } from '../../../components/form-fields';
import { InvitationOutcome } from '../../staff/components/invitation-outcome';
import { useInviteSubmit } from '../../staff/components/use-invite-submit';
import { TankField } from './tank-field';

export function InviteClientForm({ className = '' }: { className?: string }) {
  const [email, setEmail] = useState('');
  const [name, setName] = useState('');
  const [tankId, setTankId] = useState('');
  const { formRef, submit, issues, outcome, pending } = useInviteSubmit(['email', 'name', 'tankId']);

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
      <form
        ref={formRef}
        noValidate
        className="mt-4 grid gap-4"
        onSubmit={(event) => {
          event.preventDefault();
          submit({ role: 'owner', email: email.trim(), name: name.trim() || undefined, tankId }, () => {
            setEmail('');
            setName('');
            setTankId('');
          });
        }}
      >
        <TextField
          label="E-mail address"
          type="email"
          autoComplete="off"
          spellCheck={false}
          value={email}
          onChange={setEmail}
          error={issues.fields.email}
        />
        <TextField
          label="Name (optional)"
          hint="Used to greet them in the e-mail."
          autoComplete="off"
          value={name}
          onChange={setName}
          error={issues.fields.name}
        />
        <TankField value={tankId} onChange={setTankId} error={issues.fields.tankId} />
        <InvitationOutcome outcome={outcome} issues={issues} />
        <Button type="submit" disabled={pending}>
          {pending ? 'Sending invitation…' : 'Send invitation'}
        </Button>
      </form>
    </section>
  );
}
