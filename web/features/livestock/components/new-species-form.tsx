import { useState, type FormEvent } from 'react';
import {
  livestockGroups,
  waterTypes,
  type HandlingHazard,
  type LivestockGroup,
  type SpeciesInput,
  type WaterType,
} from '@shared/schemas/species';
import { Button } from '../../../components/button';
import {
  CheckboxField,
  FieldError,
  SelectField,
  TextAreaField,
  TextField,
} from '../../../components/form-fields';
import { ApiError } from '../../../lib/api-client';
import { parseUnsignedDecimal } from '../../../lib/decimal';
import { fieldErrors } from '../../../lib/form-issues';
import { useCreateSpecies } from '../api/create-species';

const groupLabels: Record<LivestockGroup, string> = {
  fish: 'Fish',
  'sps-coral': 'Small-polyp stony coral',
  'lps-coral': 'Large-polyp stony coral',
  'soft-coral': 'Soft coral',
  zoanthid: 'Zoanthid',
  mushroom: 'Mushroom coral',
  anemone: 'Anemone',
  clam: 'Clam',
  shrimp: 'Shrimp',
  snail: 'Snail',
  crab: 'Crab',
  urchin: 'Urchin',
  starfish: 'Starfish',
  plant: 'Plant',
  'other-invertebrate': 'Other invertebrate',
};

const waterLabels: Record<WaterType, string> = { marine: 'Marine', fresh: 'Fresh', brackish: 'Brackish' };

const hazardLabels: Record<HandlingHazard['hazard'] | '', string> = {
  '': 'None known',
  'contact-toxin': 'Toxic to touch',
  irritant: 'Irritant',
  'venomous-spines': 'Venomous spines',
  'sharp-spines': 'Sharp spines',
  bite: 'Bites',
};

const nipChoices = [
  { value: 'false', label: 'No' },
  { value: 'sometimes', label: 'Sometimes' },
  { value: 'true', label: 'Yes' },
];

const asTendency = (value: string) => (value === 'sometimes' ? 'sometimes' : value === 'true');

/** A species missing from the catalogue, added for this company with the care data the checks need. */
export function NewSpeciesForm({
  defaultWater,
  onCreated,
}: {
  defaultWater: WaterType;
  onCreated: () => void;
}) {
  const [commonName, setCommonName] = useState('');
  const [scientificName, setScientificName] = useState('');
  const [family, setFamily] = useState('');
  const [water, setWater] = useState<WaterType[]>([defaultWater]);
  const [group, setGroup] = useState<LivestockGroup>('fish');
  const [adultSize, setAdultSize] = useState('');
  const [tempMin, setTempMin] = useState('');
  const [tempMax, setTempMax] = useState('');
  const [careNotes, setCareNotes] = useState('');
  const [stings, setStings] = useState(false);
  const [reach, setReach] = useState('');
  const [wanders, setWanders] = useState(false);
  const [nipsCorals, setNipsCorals] = useState('false');
  const [eatsSmallFish, setEatsSmallFish] = useState(false);
  const [hazard, setHazard] = useState<HandlingHazard['hazard'] | ''>('');
  const [caution, setCaution] = useState('');
  const create = useCreateSpecies();
  const errors = create.error instanceof ApiError ? fieldErrors(create.error.issues) : {};

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const min = parseUnsignedDecimal(tempMin);
    const max = parseUnsignedDecimal(tempMax);
    const input: SpeciesInput = {
      commonName,
      scientificName,
      ...(family.trim() ? { family: family.trim() } : {}),
      profile: {
        waterTypes: water,
        group,
        ranges: min !== null && max !== null ? { temperature: { min, max } } : {},
        ...(parseUnsignedDecimal(adultSize) !== null
          ? { adultSizeCm: parseUnsignedDecimal(adultSize)! }
          : {}),
        behaviour: {
          stings,
          ...(stings && parseUnsignedDecimal(reach) !== null
            ? { stingReachCm: parseUnsignedDecimal(reach)! }
            : {}),
          wanders,
          nipsCorals: asTendency(nipsCorals),
          eatsSmallFish,
          ...(hazard ? { toxic: { hazard, caution: caution.trim() } } : {}),
        },
        careNotes,
      },
    };
    create.mutate(input, { onSuccess: onCreated });
  };

  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Add your own species">
      {create.error instanceof ApiError && create.error.status === 409 && (
        <p role="alert" className="font-bold text-alert-700">
          {create.error.message}
        </p>
      )}
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField
          label="Common name"
          value={commonName}
          onChange={setCommonName}
          error={errors.commonName}
        />
        <TextField
          label="Scientific name"
          hint="“Genus species” or “Genus spp.”"
          value={scientificName}
          onChange={setScientificName}
          error={errors.scientificName}
        />
        <TextField
          label="Family (optional)"
          hint="e.g. Pomacentridae"
          value={family}
          onChange={setFamily}
          error={errors.family}
        />
        <SelectField
          label="Kind"
          value={group}
          onChange={(value) => setGroup(value as LivestockGroup)}
          options={livestockGroups.map((value) => ({ value, label: groupLabels[value] }))}
        />
      </div>
      <fieldset>
        <legend className="font-bold text-ink-900">Water it lives in</legend>
        <div className="mt-1 flex flex-wrap gap-x-6">
          {waterTypes.map((type) => (
            <CheckboxField
              key={type}
              label={waterLabels[type]}
              checked={water.includes(type)}
              onChange={(checked) =>
                setWater(checked ? [...water, type] : water.filter((entry) => entry !== type))
              }
            />
          ))}
        </div>
        {errors['profile.waterTypes'] && (
          <FieldError className="mt-1">{errors['profile.waterTypes']}</FieldError>
        )}
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-3">
        <TextField
          label="Adult size (cm)"
          hint="Needed for fish"
          inputMode="decimal"
          value={adultSize}
          onChange={setAdultSize}
          error={errors['profile.adultSizeCm']}
        />
        <TextField
          label="Lowest temperature (°C)"
          inputMode="decimal"
          value={tempMin}
          onChange={setTempMin}
        />
        <TextField
          label="Highest temperature (°C)"
          inputMode="decimal"
          value={tempMax}
          onChange={setTempMax}
          error={errors['profile.ranges.temperature.max']}
        />
      </div>
      <fieldset className="space-y-1">
        <legend className="font-bold text-ink-900">Behaviour</legend>
        <CheckboxField label="Stings its neighbours" checked={stings} onChange={setStings} />
        {stings && (
          <TextField
            label="Sting reach (cm)"
            inputMode="decimal"
            value={reach}
            onChange={setReach}
            error={errors['profile.behaviour.stingReachCm']}
          />
        )}
        <CheckboxField label="Moves around the tank" checked={wanders} onChange={setWanders} />
        <CheckboxField
          label="Eats fish small enough to swallow"
          checked={eatsSmallFish}
          onChange={setEatsSmallFish}
        />
        <SelectField label="Nips corals" value={nipsCorals} onChange={setNipsCorals} options={nipChoices} />
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField
          label="Handling hazard"
          value={hazard}
          onChange={(value) => setHazard(value as HandlingHazard['hazard'] | '')}
          options={(Object.keys(hazardLabels) as (HandlingHazard['hazard'] | '')[]).map((value) => ({
            value,
            label: hazardLabels[value],
          }))}
        />
        {hazard && (
          <TextField
            label="Caution to show"
            hint="e.g. “Wear gloves and eye protection.”"
            value={caution}
            onChange={setCaution}
            error={errors['profile.behaviour.toxic.caution']}
          />
        )}
      </div>
      <TextAreaField
        label="Care notes"
        value={careNotes}
        onChange={setCareNotes}
        rows={3}
        error={errors['profile.careNotes']}
      />
      <Button type="submit" tone="secondary" disabled={create.isPending}>
        {create.isPending ? 'Adding…' : 'Add species'}
      </Button>
    </form>
  );
}
