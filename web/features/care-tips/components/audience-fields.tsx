import { useId, useState } from 'react';
import { useFormState, useWatch } from 'react-hook-form';
import { tankStyleLabels, tankStyles } from '@shared/parameters/limit-templates';
import { equipmentKindLabels, equipmentKinds } from '@shared/schemas/equipment';
import { FieldError } from '../../../components/field-error';
import { CheckboxGroupField, RadioGroupField, SelectField } from '../../../components/form-fields';
import { capitalise, formatCount } from '../../../lib/format';
import { useSpecies, useSpeciesByName } from '../../../lib/queries/species';
import { useTankChoices } from '../../../lib/queries/tank-choices';
import { useAudienceCount } from '../api/count-audience';
import { audienceOf, type AudienceKind, type TipFormValues } from '../utils/tip-form';

const kindOptions: { value: AudienceKind; label: string; hint: string }[] = [
  { value: 'all', label: 'All tanks', hint: 'Every tank the company looks after.' },
  { value: 'style', label: 'Tanks of a style', hint: 'Reefs, fish-only marine, planted freshwater…' },
  { value: 'species', label: 'Tanks keeping a species', hint: 'From the livestock in each tank now.' },
  { value: 'equipment', label: 'Tanks with a kind of equipment', hint: 'Heaters, dosing pumps, chillers…' },
  { value: 'tanks', label: 'Chosen tanks', hint: 'Tick them one by one.' },
];

const plural = (count: number, one: string, many: string) =>
  `${formatCount(count)} ${count === 1 ? one : many}`;

/** A search that names the species, then the matches to choose from; the chosen one stays named. */
function SpeciesChoice() {
  const id = useId();
  const [q, setQ] = useState('');
  const speciesId = useWatch<TipFormValues, 'speciesId'>({ name: 'speciesId' });
  const { errors } = useFormState<TipFormValues>({ name: 'speciesId' });
  const chosen = useSpecies(speciesId === '' ? null : speciesId);
  const search = q.trim();
  const results = useSpeciesByName(search);
  const matches = search.length >= 2 ? (results.data ?? []) : [];
  return (
    <div className="grid gap-3">
      <div>
        <label htmlFor={`${id}-q`} className="block font-bold text-ink-900">
          Find the species
        </label>
        <p id={`${id}-hint`} className="mt-0.5 text-sm text-ink-700">
          Common or scientific name, two letters or more.
        </p>
        <input
          id={`${id}-q`}
          type="search"
          value={q}
          onChange={(event) => setQ(event.target.value)}
          // Enter searches as typing does; it must not send the whole tip.
          onKeyDown={(event) => {
            if (event.key === 'Enter') event.preventDefault();
          }}
          autoComplete="off"
          aria-describedby={`${id}-hint`}
          className="mt-1 min-h-12 w-full min-w-0 rounded-lg border-2 border-ink-300 bg-white px-3 text-base text-ink-950 focus:border-ink-700"
        />
      </div>
      {speciesId !== '' && (
        <p className="rounded-lg bg-brine-100 p-3 text-ink-900">
          Chosen:{' '}
          <strong>
            {chosen.data ? capitalise(chosen.data.commonName) : chosen.isError ? speciesId : 'Loading…'}
          </strong>
          {chosen.data && <i className="text-ink-700"> {chosen.data.scientificName}</i>}
        </p>
      )}
      {search.length >= 2 && results.isPending && <p className="text-sm text-ink-700">Searching…</p>}
      {search.length >= 2 && results.isError && (
        <FieldError>The catalogue could not be searched. Try again.</FieldError>
      )}
      {search.length >= 2 && results.isSuccess && matches.length === 0 && (
        <p className="text-sm text-ink-700">No species match “{search}”.</p>
      )}
      {matches.length > 0 ? (
        <RadioGroupField<TipFormValues>
          name="speciesId"
          label="Species"
          look="rows"
          className="[&>div]:sm:grid-cols-2"
          options={matches.map((entry) => ({
            value: entry.id,
            label: capitalise(entry.commonName),
            hint: <i>{entry.scientificName}</i>,
          }))}
        />
      ) : (
        errors.speciesId?.message && <FieldError>{errors.speciesId.message}</FieldError>
      )}
    </div>
  );
}

function TankChoice() {
  const tanks = useTankChoices();
  if (tanks.isPending)
    return (
      <p role="status" className="text-ink-700">
        Loading the tanks…
      </p>
    );
  if (tanks.isError) return <FieldError>The tanks could not be loaded; try again in a moment.</FieldError>;
  return (
    <CheckboxGroupField<TipFormValues>
      name="tankIds"
      label="Tanks"
      hint={`${plural(tanks.data.length, 'tank', 'tanks')} in the company’s care.`}
      columns="mt-1 grid max-h-96 gap-1 overflow-y-auto rounded-lg border border-ink-100 p-2 sm:grid-cols-2"
      options={tanks.data.map((tank) => ({
        value: tank.id,
        label: (
          <span className="min-w-0">
            {tank.name}
            <span className="block text-sm font-normal text-ink-700">
              {[tank.siteLabel, tank.ownerNames.join(', ') || 'No owner yet'].filter(Boolean).join(' · ')}
            </span>
          </span>
        ),
      }))}
    />
  );
}

/** "Reaches 3 tanks and 4 owners", counted by the API as the audience changes. */
function AudienceCountLine() {
  const [audienceKind, style, speciesId, equipmentKind, tankIds] = useWatch<
    TipFormValues,
    ['audienceKind', 'style', 'speciesId', 'equipmentKind', 'tankIds']
  >({ name: ['audienceKind', 'style', 'speciesId', 'equipmentKind', 'tankIds'] });
  const audience = audienceOf({ audienceKind, style, speciesId, equipmentKind, tankIds });
  const count = useAudienceCount(audience);
  let line;
  if (audience === null) {
    line = <p className="text-ink-700">Finish choosing who it is for to see how many it reaches.</p>;
  } else if (count.isError && !count.settling) {
    line = <FieldError className="">The count could not be made. Change the choice or try again.</FieldError>;
  } else if (!count.data || count.settling) {
    line = (
      <p className="flex items-center gap-2 text-ink-700">
        <span
          aria-hidden="true"
          className="h-4 w-4 animate-spin rounded-full border-2 border-ink-300 border-t-brine-600"
        />
        Counting the tanks and owners…
      </p>
    );
  } else if (count.data.tanks === 0) {
    line = (
      <p className="flex items-start gap-2 rounded-lg bg-watch-100 p-3 font-bold text-watch-700">
        <span aria-hidden="true">▲</span>
        <span>Reaches no tank yet. Sending needs at least one tank; you can still save it as a draft.</span>
      </p>
    );
  } else {
    line = (
      <p className="font-bold text-ink-900">
        Reaches {plural(count.data.tanks, 'tank', 'tanks')} and {plural(count.data.owners, 'owner', 'owners')}
      </p>
    );
  }
  return (
    <div role="status" aria-live="polite" className="rounded-lg border border-ink-100 bg-ink-50 p-3">
      {line}
    </div>
  );
}

/** Who the tip is for: one kind of audience, its own choice under it, and the live count. */
export function AudienceFields() {
  const audienceKind = useWatch<TipFormValues, 'audienceKind'>({ name: 'audienceKind' });
  return (
    <div className="grid gap-4">
      <RadioGroupField<TipFormValues>
        name="audienceKind"
        label="Send it to"
        look="rows"
        className="[&>div]:sm:grid-cols-2"
        options={kindOptions}
      />
      {audienceKind === 'style' && (
        <SelectField<TipFormValues>
          name="style"
          label="Style of tank"
          options={[
            { value: '', label: 'Choose a style' },
            ...tankStyles.map((value) => ({ value, label: tankStyleLabels[value] })),
          ]}
        />
      )}
      {audienceKind === 'species' && <SpeciesChoice />}
      {audienceKind === 'equipment' && (
        <SelectField<TipFormValues>
          name="equipmentKind"
          label="Kind of equipment"
          options={[
            { value: '', label: 'Choose a kind' },
            ...equipmentKinds.map((value) => ({ value, label: equipmentKindLabels[value] })),
          ]}
        />
      )}
      {audienceKind === 'tanks' && <TankChoice />}
      <AudienceCountLine />
    </div>
  );
}
