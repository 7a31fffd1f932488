import { useEffect } from 'react';
import { useWatch } from 'react-hook-form';
import { Link } from 'react-router';
import { z } from 'zod';
import { Form, useZodForm } from '../../../components/form';
import { SelectField } from '../../../components/form-fields';
import { useTechnicians } from '../../../lib/queries/technicians';
import type { ScheduleState, ScheduleWho } from '../utils/schedule-state';

const toggleClass = (active: boolean) =>
  `inline-flex min-h-11 items-center rounded-lg border-2 px-4 font-bold no-underline ${
    active
      ? 'border-ink-800 bg-ink-800 text-white'
      : 'border-ink-300 bg-white text-ink-900 hover:border-ink-700'
  }`;

const technicianForm = z.object({ technicianId: z.string() });

/** One member of staff's visits, or everyone's; applied as soon as it is chosen. */
function TechnicianFilter({ who, onChange }: { who: ScheduleWho; onChange: (who: ScheduleWho) => void }) {
  const staff = useTechnicians();
  const chosen = who === 'everyone' ? '' : who;
  const form = useZodForm(technicianForm, { defaultValues: { technicianId: chosen } });
  const technicianId = useWatch({ control: form.control, name: 'technicianId' });

  useEffect(() => {
    if (technicianId !== chosen) onChange(technicianId === '' ? 'everyone' : technicianId);
  }, [technicianId, chosen, onChange]);

  return (
    <Form
      form={form}
      role="search"
      aria-label="Whose visits"
      onSubmit={(values) => onChange(values.technicianId || 'everyone')}
      className="rounded-card bg-white p-4 shadow-card sm:max-w-sm"
    >
      <SelectField
        name="technicianId"
        label="Technician"
        disabled={staff.isPending}
        options={[
          { value: '', label: 'Everyone' },
          ...(staff.data ?? []).map((person) => ({ value: person.id, label: person.name })),
        ]}
      />
    </Form>
  );
}

/** Admins: their own visits, or everyone's with a technician filter. */
export function WhoFilter({
  who,
  hrefFor,
  onChange,
}: {
  who: ScheduleWho;
  hrefFor: (change: Partial<ScheduleState>) => string;
  onChange: (who: ScheduleWho) => void;
}) {
  const mine = who === 'me';
  return (
    <div className="grid gap-3">
      <nav aria-label="Whose schedule">
        <ul className="flex flex-wrap gap-2">
          <li>
            <Link
              to={hrefFor({ who: 'me' })}
              replace
              className={toggleClass(mine)}
              aria-current={mine ? 'page' : undefined}
            >
              My visits
            </Link>
          </li>
          <li>
            <Link
              to={hrefFor({ who: 'everyone' })}
              replace
              className={toggleClass(!mine)}
              aria-current={!mine ? 'page' : undefined}
            >
              Everyone
            </Link>
          </li>
        </ul>
      </nav>
      {/* A new key when the toggle above changes who is shown, so the select starts from the address. */}
      {!mine && <TechnicianFilter key={who} who={who} onChange={onChange} />}
    </div>
  );
}
