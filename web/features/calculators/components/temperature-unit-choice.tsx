import type { TemperatureUnit } from '../utils/temperature';
import { ChoiceGroup } from './choice-group';

const units = [
  { value: '°C', label: '°C' },
  { value: '°F', label: '°F' },
] as const;

export function TemperatureUnitChoice({
  value,
  onChange,
}: {
  value: TemperatureUnit;
  onChange: (unit: TemperatureUnit) => void;
}) {
  return <ChoiceGroup legend="Temperatures in" value={value} onChange={onChange} choices={units} />;
}
