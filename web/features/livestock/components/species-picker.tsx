import { useDeferredValue, useId, useState } from 'react';
import type { SpeciesEntry } from '@shared/schemas/livestock';
import type { WaterType } from '@shared/schemas/species';
import { CheckboxField, TextField } from '../../../components/form-fields';
import { capitalise } from '../../tanks/utils/format';
import { useSpeciesSearch } from '../api/search-species';

const waterWords: Record<WaterType, string> = { marine: 'marine', fresh: 'freshwater', brackish: 'brackish' };

/** Search the catalogue and the company's own species by name; the results are a list of choices. */
export function SpeciesPicker({
  waterType,
  selected,
  onSelect,
}: {
  waterType: WaterType;
  selected: SpeciesEntry | null;
  onSelect: (species: SpeciesEntry) => void;
}) {
  const [text, setText] = useState('');
  const [sameWater, setSameWater] = useState(true);
  const q = useDeferredValue(text.trim());
  const search = useSpeciesSearch(
    { q, waterType: sameWater ? waterType : undefined, limit: 8 },
    q.length >= 2,
  );
  const name = useId();

  return (
    <div className="space-y-3">
      <TextField
        label="Find a species"
        hint="Common or scientific name, e.g. “clownfish” or “Entacmaea”"
        type="search"
        value={text}
        onChange={setText}
        autoComplete="off"
      />
      <CheckboxField
        label={`Only species for ${waterWords[waterType]} water`}
        checked={sameWater}
        onChange={setSameWater}
      />
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
        <fieldset>
          <legend className="font-bold text-ink-900">Choose one</legend>
          <ul className="mt-2 grid gap-2 sm:grid-cols-2">
            {search.data.map((entry) => (
              <li key={entry.id}>
                <label className="flex min-h-14 cursor-pointer items-center gap-3 rounded-lg border-2 border-ink-300 bg-white px-3 py-2 hover:border-ink-700 has-checked:border-ink-800 has-checked:bg-ink-50">
                  <input
                    type="radio"
                    name={name}
                    value={entry.id}
                    checked={selected?.id === entry.id}
                    onChange={() => onSelect(entry)}
                    className="h-5 w-5 shrink-0 accent-brine-700"
                  />
                  <span className="min-w-0 font-bold text-ink-950">
                    {capitalise(entry.commonName)}
                    <br />
                    <i className="text-sm font-normal text-ink-700">{entry.scientificName}</i>
                    {entry.source === 'company' && (
                      <span className="text-sm font-normal text-ink-700"> · your own</span>
                    )}
                  </span>
                </label>
              </li>
            ))}
          </ul>
        </fieldset>
      )}
    </div>
  );
}
