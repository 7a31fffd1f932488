import type { FieldValues, Path } from 'react-hook-form';
import { SelectField } from '../../../components/form-fields';
import { useTankChoices } from '../../../lib/queries/tank-choices';

/** The tank a client is invited to follow, bound to `name`; its own loading, empty and error states. */
export function TankField<T extends FieldValues>({ name }: { name: Path<T> }) {
  const tanks = useTankChoices();
  const hint = tanks.isPending
    ? 'Loading tanks…'
    : tanks.isError
      ? 'The tanks could not be loaded. Reload the page to try again.'
      : tanks.data.length === 0
        ? 'Your company has no tanks yet. Add a tank before inviting its owner.'
        : 'They will see this tank and its readings, visits and alerts.';
  const options = [
    { value: '', label: 'Choose a tank' },
    ...(tanks.data ?? []).map((tank) => ({
      value: tank.id,
      label: tank.siteLabel ? `${tank.name} — ${tank.siteLabel}` : tank.name,
    })),
  ];
  return (
    <SelectField<T>
      name={name}
      label="Tank"
      hint={hint}
      options={options}
      disabled={!tanks.isSuccess || tanks.data.length === 0}
    />
  );
}
