import { z } from 'zod';
import { speciesInput, type SpeciesInput } from '@shared/schemas/species';
import {
  handlingHazard,
  livestockGroup,
  livestockGroupLabels,
  livestockGroups,
  type HandlingHazard,
  type LivestockGroup,
} from '@shared/livestock/species';
import { waterType, waterTypes, type WaterType } from '@shared/parameters/water-types';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import {
  CheckboxField,
  CheckboxGroupField,
  DecimalField,
  SelectField,
  TextAreaField,
  TextField,
} from '../../../components/form-fields';
import { blankAsUndefined, decimalText } from '../../../lib/form-values';
import { useCreateSpecies } from '../api/create-species';

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
const optionalNumber = decimalText(z.number().optional());

/** The form mirrors the species' own shape, so the API's issues land under their fields by path. */
const speciesForm = z
  .object({
    commonName: z.string(),
    scientificName: z.string(),
    family: blankAsUndefined(z.string().trim().optional()),
    profile: z.object({
      waterTypes: z.array(waterType),
      group: livestockGroup,
      adultSizeCm: optionalNumber,
      ranges: z.object({ temperature: z.object({ min: optionalNumber, max: optionalNumber }) }),
      behaviour: z.object({
        stings: z.boolean(),
        stingReachCm: optionalNumber,
        wanders: z.boolean(),
        nipsCorals: z.enum(['false', 'sometimes', 'true']),
        eatsSmallFish: z.boolean(),
        toxic: z.object({
          hazard: z.union([z.literal(''), handlingHazard.shape.hazard]),
          caution: z.string().trim(),
        }),
      }),
      careNotes: z.string(),
    }),
  })
  .transform(({ profile: { ranges, behaviour, ...profile }, ...names }): SpeciesInput => {
    const { min, max } = ranges.temperature;
    const { stings, stingReachCm, nipsCorals, toxic, ...rest } = behaviour;
    return {
      ...names,
      profile: {
        ...profile,
        ranges: min !== undefined && max !== undefined ? { temperature: { min, max } } : {},
        behaviour: {
          ...rest,
          stings,
          ...(stings && stingReachCm !== undefined ? { stingReachCm } : {}),
          nipsCorals: asTendency(nipsCorals),
          ...(toxic.hazard ? { toxic: { hazard: toxic.hazard, caution: toxic.caution } } : {}),
        },
      },
    };
  })
  .pipe(speciesInput);
type SpeciesFormValues = z.input<typeof speciesForm>;

/** A species missing from the catalogue, added for this company with the care data the checks need. */
export function NewSpeciesForm({
  defaultWater,
  onCreated,
}: {
  defaultWater: WaterType;
  onCreated: () => void;
}) {
  const create = useCreateSpecies();
  const form = useZodForm(speciesForm, {
    defaultValues: {
      commonName: '',
      scientificName: '',
      family: '',
      profile: {
        waterTypes: [defaultWater],
        group: 'fish',
        adultSizeCm: '',
        ranges: { temperature: { min: '', max: '' } },
        behaviour: {
          stings: false,
          stingReachCm: '',
          wanders: false,
          nipsCorals: 'false',
          eatsSmallFish: false,
          toxic: { hazard: '', caution: '' },
        },
        careNotes: '',
      },
    },
  });
  const stings = form.watch('profile.behaviour.stings');
  const hazard = form.watch('profile.behaviour.toxic.hazard');

  return (
    <Form
      form={form}
      className="space-y-4"
      aria-label="Add your own species"
      onSubmit={async (input) => {
        await create.mutateAsync(input);
        onCreated();
      }}
    >
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField<SpeciesFormValues> name="commonName" label="Common name" />
        <TextField<SpeciesFormValues>
          name="scientificName"
          label="Scientific name"
          hint="“Genus species” or “Genus spp.”"
        />
        <TextField<SpeciesFormValues> name="family" label="Family (optional)" hint="e.g. Pomacentridae" />
        <SelectField<SpeciesFormValues>
          name="profile.group"
          label="Kind"
          options={livestockGroups.map((value: LivestockGroup) => ({
            value,
            label: livestockGroupLabels[value],
          }))}
        />
      </div>
      <CheckboxGroupField<SpeciesFormValues>
        name="profile.waterTypes"
        label="Water it lives in"
        columns="mt-1 flex flex-wrap gap-x-6"
        options={waterTypes.map((type) => ({ value: type, label: waterLabels[type] }))}
      />
      <div className="grid gap-4 sm:grid-cols-3">
        <DecimalField<SpeciesFormValues>
          name="profile.adultSizeCm"
          label="Adult size (cm)"
          hint="Needed for fish"
        />
        <DecimalField<SpeciesFormValues>
          name="profile.ranges.temperature.min"
          label="Lowest temperature (°C)"
        />
        <DecimalField<SpeciesFormValues>
          name="profile.ranges.temperature.max"
          label="Highest temperature (°C)"
        />
      </div>
      <fieldset className="space-y-1">
        <legend className="font-bold text-ink-900">Behaviour</legend>
        <CheckboxField<SpeciesFormValues> name="profile.behaviour.stings" label="Stings its neighbours" />
        {stings && (
          <DecimalField<SpeciesFormValues> name="profile.behaviour.stingReachCm" label="Sting reach (cm)" />
        )}
        <CheckboxField<SpeciesFormValues> name="profile.behaviour.wanders" label="Moves around the tank" />
        <CheckboxField<SpeciesFormValues>
          name="profile.behaviour.eatsSmallFish"
          label="Eats fish small enough to swallow"
        />
        <SelectField<SpeciesFormValues>
          name="profile.behaviour.nipsCorals"
          label="Nips corals"
          options={nipChoices}
        />
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField<SpeciesFormValues>
          name="profile.behaviour.toxic.hazard"
          label="Handling hazard"
          options={(Object.keys(hazardLabels) as (HandlingHazard['hazard'] | '')[]).map((value) => ({
            value,
            label: hazardLabels[value],
          }))}
        />
        {hazard && (
          <TextField<SpeciesFormValues>
            name="profile.behaviour.toxic.caution"
            label="Caution to show"
            hint="e.g. “Wear gloves and eye protection.”"
          />
        )}
      </div>
      <TextAreaField<SpeciesFormValues> name="profile.careNotes" label="Care notes" rows={3} />
      <FormProblem />
      <SubmitButton tone="secondary" pending="Adding…">
        Add species
      </SubmitButton>
    </Form>
  );
}
