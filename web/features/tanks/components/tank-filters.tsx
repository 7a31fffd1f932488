import { useEffect, useState } from 'react';
import type { AssignableStaff, TankListQuery } from '@shared/schemas/tanks';
import { SelectField, TextField } from '../../../components/form-fields';

/**
 * Search and technician filter for the console's tank list. The search waits for a pause in
 * typing so each keystroke does not become a request.
 */
export function TankFilters({
  query,
  technicians,
  onChange,
}: {
  query: TankListQuery;
  technicians: readonly AssignableStaff[];
  onChange: (query: TankListQuery) => void;
}) {
  const [text, setText] = useState(query.q ?? '');
  useEffect(() => {
    if (text.trim() === (query.q ?? '')) return;
    const timer = setTimeout(() => onChange({ ...query, q: text.trim() || undefined }), 250);
    return () => clearTimeout(timer);
  }, [text, query, onChange]);

  return (
    <form
      role="search"
      aria-label="Find tanks"
      onSubmit={(event) => {
        event.preventDefault();
        onChange({ ...query, q: text.trim() || undefined });
      }}
      className="grid gap-3 rounded-card bg-white p-4 shadow-card sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]"
    >
      <TextField
        label="Search"
        hint="Tank, site or client name"
        type="search"
        value={text}
        onChange={setText}
        autoComplete="off"
      />
      <SelectField
        label="Technician"
        hint="Who looks after the tank"
        value={query.technicianId ?? ''}
        onChange={(technicianId) =>
          onChange({ ...query, technicianId: (technicianId || undefined) as TankListQuery['technicianId'] })
        }
        options={[
          { value: '', label: 'Everyone' },
          { value: 'none', label: 'Nobody assigned' },
          ...technicians.map((person) => ({ value: person.id, label: person.name })),
        ]}
      />
    </form>
  );
}
