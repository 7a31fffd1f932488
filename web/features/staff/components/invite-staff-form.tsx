import { useState } from 'react';
import { Button } from '../../../components/button';
import { TextField } from '../../../components/form-fields';
import type { StaffRole } from '../api/change-staff-role';
import { ChoiceField } from './choice-field';
import { InvitationOutcome } from './invitation-outcome';
import { useInviteSubmit } from './use-invite-submit';

const roleChoices = [
  {
    value: 'technician',
    label: 'Technician',
    hint: 'Records visits and readings, and sees every client tank.',
  },
  { value: 'admin', label: 'Admin', hint: 'Also manages staff, clients and invitations.' },
] as const;

export function InviteStaffForm({ className = '' }: { className?: string }) {
  const [email, setEmail] = useState('');
  const [name, setName] = useState('');
  const [role, setRole] = useState<StaffRole>('technician');
  const { formRef, submit, issues, outcome, pending } = useInviteSubmit(['email', 'name', 'role']);

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
      <form
        ref={formRef}
        noValidate
        className="mt-4 grid gap-4"
        onSubmit={(event) => {
          event.preventDefault();
          submit({ role, email: email.trim(), name: name.trim() || undefined }, () => {
            setEmail('');
            setName('');
            setRole('technician');
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
        <ChoiceField legend="Role" name="staff-role" value={role} onChange={setRole} choices={roleChoices} />
        {issues.fields.role && <p className="text-sm font-bold text-alert-700">{issues.fields.role}</p>}
        <InvitationOutcome outcome={outcome} issues={issues} />
        <Button type="submit" disabled={pending}>
          {pending ? 'Sending invitation…' : 'Send invitation'}
        </Button>
      </form>
    </section>
  );
}
