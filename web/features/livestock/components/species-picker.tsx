import { useDeferredValue } from 'react';
import { FormProvider } from 'react-hook-form';
import { z } from 'zod';
import { speciesQuery, type SpeciesEntry } from '@shared/schemas/livestock';
import type { WaterType } from '@shared/parameters/water-types';
import { useZodForm } from '../../../components/form';
import { CheckboxField, TextField } from '../../../components/form-fields';
import { RadioGroup } from '../../../components/radio-group';
import { capitalise } from '../../../lib/format';
import { useSpeciesSearch } from '../api/search-species';

const waterWords: Record<WaterType, string> = { marine: 'marine', fresh: 'freshwater', brackish: 'brackish' };

const searchForm = z.object({ q: speciesQuery.shape.q.unwrap(), sameWater: z.boolean() });

/**
 * Search the catalogue and the company's own species by name; the results are a list of choices.
 * It sits inside the add-livestock form, so its search fields have a form of their own (no element).
 */
export function SpeciesPicker({
  waterType,
  selected,
  onSelect,
}: {
  waterType: WaterType;
  selected: SpeciesEntry | null;
  onSelect: (species: SpeciesEntry) => void;
}) {
  const form = useZodForm(searchForm, { defaultValues: { q: '', sameWater: true } });
  const q = useDeferredValue(form.watch('q').trim());
  const sameWater = form.watch('sameWater');
  const search = useSpeciesSearch(
    { q, waterType: sameWater ? waterType : undefined, limit: 8 },
    q.length >= 2,
  );

  return (
    <FormProvider {...form}>
      <div className="space-y-3">
        <TextField
          name="q"
          label="Find a species"
          hint="Common or scientific name, e.g. “clownfish” or “Entacmaea”"
          type="search"
          autoComplete="off"
        />
        <CheckboxField name="sameWater" label={`Only species for ${waterWords[waterType]} water`} />
        {q.length < 2 ? null : search.isPending ? (
          <p role="status" className="text-sm text-ink-700">
            Searching…
          </p>
        ) : search.isError ? (
          <p role="alert" className="text-sm font-bold text-alert-700">
            The catalogue could not be searched. Try again.
          </p>
        ) : search.data.length === 0 ? (
          <p role="status" className="text-sm text-ink-700">
            Nothing matches “{q}”. Add it as your company’s own species below.
          </p>
        ) : (
          <RadioGroup
            legend="Choose one"
            look="rows"
            className="[&>div]:sm:grid-cols-2"
            value={selected?.id}
            onChange={(id) => {
              const entry = search.data.find((option) => option.id === id);
              if (entry) onSelect(entry);
            }}
            options={search.data.map((entry) => ({
              value: entry.id,
              label: capitalise(entry.commonName),
              hint: (
                <>
                  <i>{entry.scientificName}</i>
                  {entry.source === 'company' && ' · your own'}
                </>
              ),
            }))}
          />
        )}
      </div>
    </FormProvider>
  );
}
