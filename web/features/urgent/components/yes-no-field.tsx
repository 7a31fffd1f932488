import type { ReactNode } from 'react';
import { useController, useFormContext, type FieldValues, type Path } from 'react-hook-form';
import { RadioGroup } from '../../../components/radio-group';

/** A yes/no question as two large tiles, bound to a boolean field (unanswered until one is chosen). */
export function YesNoField<T extends FieldValues>({
  name,
  label,
  hint,
}: {
  name: Path<T>;
  label: ReactNode;
  hint?: ReactNode;
}) {
  const { control } = useFormContext<T>();
  const { field, fieldState } = useController<T>({ control, name });
  const value = field.value === true ? 'yes' : field.value === false ? 'no' : undefined;
  return (
    <RadioGroup<'yes' | 'no'>
      legend={label}
      hint={hint}
      error={fieldState.error?.message}
      name={field.name}
      value={value}
      onChange={(choice) => field.onChange(choice === 'yes')}
      options={[
        { value: 'yes', label: 'Yes' },
        { value: 'no', label: 'No' },
      ]}
      className="[&>div>label]:min-w-24 [&>div>label]:justify-center"
    />
  );
}
