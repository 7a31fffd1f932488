import { useState, type FormEvent } from 'react';
import type { SpeciesEntry } from '@shared/schemas/livestock';
import type { LivestockStatus } from '@shared/schemas/livestock-status';
import { livestockStatusLabels } from '@shared/schemas/livestock';
import type { WaterType } from '@shared/schemas/species';
import { Button } from '../../../components/button';
import { CheckboxField, SelectField, TextAreaField, TextField } from '../../../components/form-fields';
import { ApiError } from '../../../lib/api-client';
import { fieldErrors } from '../../../lib/form-issues';
import { capitalise } from '../../tanks/utils/format';
import { useAddLivestock } from '../api/add-livestock';
import { useLivestockCheck } from '../api/check-livestock';
import { CompatibilityWarnings } from './compatibility-warnings';
import { HandlingCaution, stingCaution } from './handling-caution';
import { SpeciesPicker } from './species-picker';

const addableStatuses: LivestockStatus[] = ['stable', 'thriving', 'watch', 'sick'];

function SelectedSpecies({ species }: { species: SpeciesEntry }) {
  const hazard =
    species.profile.behaviour.toxic ?? (species.profile.behaviour.stings ? stingCaution : undefined);
  return (
    <div className="space-y-2 rounded-lg bg-ink-50 p-4">
      <p className="font-bold text-ink-950">
        {capitalise(species.commonName)} <i className="font-normal text-ink-700">{species.scientificName}</i>
      </p>
      <p className="text-sm text-ink-950">{species.profile.careNotes}</p>
      {hazard && <HandlingCaution hazard={hazard} />}
    </div>
  );
}

/**
 * Adding livestock: choose a species, see at once how it fits with what lives in the tank, and
 * add it anyway only after saying the warnings have been read.
 */
export function AddLivestockForm({ tankId, waterType }: { tankId: string; waterType: WaterType }) {
  const [species, setSpecies] = useState<SpeciesEntry | null>(null);
  const [quantity, setQuantity] = useState('1');
  const [nickname, setNickname] = useState('');
  const [placement, setPlacement] = useState('');
  const [source, setSource] = useState('');
  const [addedOn, setAddedOn] = useState('');
  const [status, setStatus] = useState<LivestockStatus>('stable');
  const [note, setNote] = useState('');
  const [acknowledged, setAcknowledged] = useState(false);
  const [added, setAdded] = useState<string | null>(null);
  const check = useLivestockCheck(tankId, species?.id ?? null);
  const add = useAddLivestock(tankId);
  const warnings = check.data?.warnings ?? [];
  const errors = add.error instanceof ApiError ? fieldErrors(add.error.issues) : {};

  const choose = (entry: SpeciesEntry) => {
    setSpecies(entry);
    setAcknowledged(false);
    setAdded(null);
    add.reset();
  };

  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (!species) return;
    add.mutate(
      {
        speciesId: species.id,
        quantity: Number(quantity),
        nickname: nickname.trim() || null,
        placement: placement.trim() || null,
        source: source.trim() || null,
        addedOn: addedOn || null,
        status,
        note: note.trim() || null,
        acknowledgeWarnings: acknowledged,
      },
      {
        onSuccess: (item) => {
          setAdded(capitalise(item.species.commonName));
          setSpecies(null);
          setQuantity('1');
          setNickname('');
          setPlacement('');
          setSource('');
          setNote('');
          setAcknowledged(false);
        },
        // The tank changed since the check (someone else added livestock): show the new warnings.
        onError: (error) => {
          if (error instanceof ApiError && error.status === 409) void check.refetch();
        },
      },
    );
  };

  const mustAcknowledge = warnings.length > 0 && !acknowledged;

  return (
    <form
      onSubmit={submit}
      noValidate
      className="space-y-4 rounded-card bg-white p-5 shadow-card"
      aria-labelledby="add-livestock-title"
    >
      <h2 id="add-livestock-title" className="text-xl font-bold text-ink-900">
        Add livestock
      </h2>
      {added && (
        <p role="status" className="rounded-lg bg-healthy-100 p-3 font-bold text-healthy-700">
          {added} added to the tank.
        </p>
      )}
      <SpeciesPicker waterType={waterType} selected={species} onSelect={choose} />
      {species && (
        <>
          <SelectedSpecies species={species} />
          <section aria-labelledby="check-title" aria-live="polite" className="space-y-2">
            <h3 id="check-title" className="text-lg font-bold text-ink-900">
              How it fits with the tank
            </h3>
            {check.isPending ? (
              <p className="text-sm text-ink-700">Checking against what lives in the tank…</p>
            ) : check.isError ? (
              <p className="text-sm font-bold text-alert-700">
                The check did not run. Try choosing the species again.
              </p>
            ) : warnings.length === 0 ? (
              <p className="rounded-lg bg-healthy-100 p-3 text-sm text-healthy-700">
                <span className="font-bold">No known problems</span> with what lives in the tank now. That is
                not a guarantee: watch it after adding it.
              </p>
            ) : (
              <CompatibilityWarnings warnings={warnings} />
            )}
          </section>
          <div className="grid gap-4 sm:grid-cols-2">
            <TextField
              label="How many"
              inputMode="numeric"
              value={quantity}
              onChange={setQuantity}
              error={errors.quantity}
            />
            <SelectField
              label="Condition"
              value={status}
              onChange={(value) => setStatus(value as LivestockStatus)}
              options={addableStatuses.map((value) => ({ value, label: livestockStatusLabels[value] }))}
              error={errors.status}
            />
            <TextField label="Nickname (optional)" value={nickname} onChange={setNickname} maxLength={80} />
            <TextField
              label="Where in the tank (optional)"
              value={placement}
              onChange={setPlacement}
              maxLength={120}
            />
            <TextField
              label="Where it came from (optional)"
              value={source}
              onChange={setSource}
              maxLength={120}
            />
            <TextField
              label="Added on (optional)"
              type="date"
              value={addedOn}
              onChange={setAddedOn}
              error={errors.addedOn}
            />
          </div>
          <TextAreaField
            label="Note for the history (optional)"
            value={note}
            onChange={setNote}
            maxLength={500}
            rows={2}
          />
          {warnings.length > 0 && (
            <CheckboxField
              label="I have read the warnings and want to add it anyway"
              hint="The owners see the livestock, not these warnings; say in the note how you placed it."
              checked={acknowledged}
              onChange={setAcknowledged}
            />
          )}
          {add.isError && (
            <p role="alert" className="font-bold text-alert-700">
              {add.error instanceof ApiError && add.error.status === 409
                ? 'The tank changed since the check. Read the warnings above and confirm again.'
                : add.error instanceof ApiError && add.error.status === 400
                  ? 'Some fields need attention.'
                  : 'It could not be added. Please try again.'}
            </p>
          )}
          <Button type="submit" disabled={add.isPending || check.isPending || mustAcknowledge}>
            {add.isPending ? 'Adding…' : warnings.length > 0 ? 'Add anyway' : 'Add to the tank'}
          </Button>
        </>
      )}
    </form>
  );
}
