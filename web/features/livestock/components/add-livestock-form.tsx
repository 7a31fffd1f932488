import { useState } from 'react';
import { z } from 'zod';
import { addLivestockInput, livestockStatusLabels, type SpeciesEntry } from '@shared/schemas/livestock';
import type { LivestockStatus } from '@shared/schemas/livestock-status';
import type { WaterType } from '@shared/parameters/water-types';
import { Form, FormProblem, SubmitButton, useZodForm } from '../../../components/form';
import { CheckboxField, SelectField, TextAreaField, TextField } from '../../../components/form-fields';
import { ApiError } from '../../../lib/api-client';
import { blankAsNull, decimalText } from '../../../lib/form-values';
import { capitalise } from '../../../lib/format';
import { useAddLivestock } from '../api/add-livestock';
import { useLivestockCheck } from '../api/check-livestock';
import { CompatibilityWarnings } from '../../../components/compatibility-warnings';
import { TipSuggestions } from '../../../components/tip-suggestions';
import { HandlingCaution, stingCaution } from './handling-caution';
import { SpeciesPicker } from './species-picker';

const addableStatuses: LivestockStatus[] = ['stable', 'thriving', 'watch', 'sick'];

const fields = addLivestockInput.shape;
const addForm = z.object({
  quantity: decimalText(fields.quantity.unwrap()),
  status: fields.status.unwrap(),
  nickname: blankAsNull(fields.nickname),
  placement: blankAsNull(fields.placement),
  source: blankAsNull(fields.source),
  addedOn: blankAsNull(fields.addedOn),
  note: blankAsNull(fields.note),
  acknowledgeWarnings: z.boolean(),
});
type AddFormValues = z.input<typeof addForm>;

const emptyValues: AddFormValues = {
  quantity: '1',
  status: 'stable',
  nickname: '',
  placement: '',
  source: '',
  addedOn: '',
  note: '',
  acknowledgeWarnings: false,
};

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
  const [added, setAdded] = useState<string | null>(null);
  const check = useLivestockCheck(tankId, species?.id ?? null);
  const add = useAddLivestock(tankId);
  const form = useZodForm(addForm, { defaultValues: emptyValues });
  const warnings = check.data?.warnings ?? [];
  const acknowledged = form.watch('acknowledgeWarnings');

  const choose = (entry: SpeciesEntry) => {
    setSpecies(entry);
    setAdded(null);
    form.setValue('acknowledgeWarnings', false);
    form.clearErrors();
  };

  const mustAcknowledge = warnings.length > 0 && !acknowledged;

  return (
    <Form
      form={form}
      className="space-y-4 rounded-card bg-white p-5 shadow-card"
      aria-labelledby="add-livestock-title"
      onSubmit={async (values) => {
        if (!species) return;
        try {
          const item = await add.mutateAsync({ speciesId: species.id, ...values });
          setAdded(capitalise(item.species.commonName));
          setSpecies(null);
          form.reset({ ...emptyValues, addedOn: values.addedOn ?? '', status: values.status });
        } catch (error) {
          // The tank changed since the check (someone else added livestock): show the new warnings.
          if (!(error instanceof ApiError) || error.status !== 409) throw error;
          void check.refetch();
          form.setValue('acknowledgeWarnings', false);
          form.setError('root.server', {
            type: 'server',
            message: 'The tank changed since the check. Read the warnings above and confirm again.',
          });
        }
      }}
    >
      <h2 id="add-livestock-title" className="text-xl font-bold text-ink-900">
        Add livestock
      </h2>
      {added && (
        <p role="status" className="rounded-lg bg-healthy-100 p-3 font-bold text-healthy-700">
          {added} added to the tank.
        </p>
      )}
      {added && <TipSuggestions tankId={tankId} />}
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
            <TextField<AddFormValues> name="quantity" label="How many" inputMode="numeric" />
            <SelectField<AddFormValues>
              name="status"
              label="Condition"
              options={addableStatuses.map((value) => ({ value, label: livestockStatusLabels[value] }))}
            />
            <TextField<AddFormValues> name="nickname" label="Nickname (optional)" maxLength={80} />
            <TextField<AddFormValues> name="placement" label="Where in the tank (optional)" maxLength={120} />
            <TextField<AddFormValues> name="source" label="Where it came from (optional)" maxLength={120} />
            <TextField<AddFormValues> name="addedOn" label="Added on (optional)" type="date" />
          </div>
          <TextAreaField<AddFormValues>
            name="note"
            label="Note for the history (optional)"
            maxLength={500}
            rows={2}
          />
          {warnings.length > 0 && (
            <CheckboxField<AddFormValues>
              name="acknowledgeWarnings"
              label="I have read the warnings and want to add it anyway"
              hint="The owners see the livestock, not these warnings; say in the note how you placed it."
            />
          )}
          <FormProblem />
          <SubmitButton pending="Adding…" disabled={check.isPending || mustAcknowledge}>
            {warnings.length > 0 ? 'Add anyway' : 'Add to the tank'}
          </SubmitButton>
        </>
      )}
    </Form>
  );
}
