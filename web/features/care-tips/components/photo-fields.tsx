import { useId } from 'react';
import { useController, useWatch } from 'react-hook-form';
import { photoUrls } from '@shared/photos/urls';
import type { PhotoItem } from '@shared/schemas/photos';
import { Button } from '../../../components/button';
import { FieldError } from '../../../components/field-error';
import { SelectField } from '../../../components/form-fields';
import { RadioGroup } from '../../../components/radio-group';
import { ErrorState } from '../../../components/states';
import { useTankPhotos } from '../../../lib/queries/photos';
import { useTankChoices } from '../../../lib/queries/tank-choices';
import type { TipFormValues } from '../utils/tip-form';

const noPhoto = 'none';

/**
 * A tip shows its photo to every owner it reaches, so only a tank's own photos and its livestock's
 * are offered: a visit's photo waits for its report to be published, and a message's belongs to
 * one conversation.
 */
const offeredToAll = (photo: PhotoItem) => photo.subject === 'tank' || photo.subject === 'livestock';

/** Each photo's words: its caption, numbered where two share one, else its place in the tank's photos. */
function photoNames(photos: PhotoItem[], tankName: string): string[] {
  const captions = photos.map((photo) => photo.caption?.trim() ?? '');
  return captions.map((caption, index) => {
    const place = `${index + 1} of ${tankName}`;
    if (caption === '') return `Photo ${place}`;
    return captions.indexOf(caption) === captions.lastIndexOf(caption)
      ? caption
      : `${caption}, photo ${place}`;
  });
}

/**
 * The tip's optional photo, chosen from one of the company's tanks: the tank, then its photos as
 * pictures to pick from. The chosen one stays shown, whichever tank is open, until removed.
 */
export function PhotoFields() {
  const id = useId();
  const { field, fieldState } = useController<TipFormValues, 'photoId'>({ name: 'photoId' });
  const tankId = useWatch<TipFormValues, 'photoTankId'>({ name: 'photoTankId' });
  const tanks = useTankChoices();
  const photos = useTankPhotos(tankId, tankId !== '');
  const tank = tanks.data?.find((t) => t.id === tankId) ?? null;
  const choices = (photos.data ?? []).filter(offeredToAll);
  const names = tank ? photoNames(choices, tank.name) : [];
  const chosen = field.value;
  const chosenIndex = choices.findIndex((photo) => photo.id === chosen);

  return (
    <div className="grid gap-4">
      {chosen && (
        <div className="flex flex-col gap-3 rounded-lg bg-brine-100 p-3 sm:flex-row sm:items-center">
          <img
            src={photoUrls(chosen).thumbnailUrl}
            alt={names[chosenIndex] ?? 'The photo chosen for this tip'}
            className="aspect-[4/3] w-full rounded-lg bg-ink-100 object-cover sm:w-48"
          />
          <div className="grid justify-items-start gap-2">
            <p id={`${id}-chosen`} className="font-bold text-ink-900">
              Owners see this photo with the tip.
            </p>
            <Button tone="secondary" aria-describedby={`${id}-chosen`} onClick={() => field.onChange(null)}>
              Remove photo
            </Button>
          </div>
        </div>
      )}
      {tanks.isPending ? (
        <p role="status" className="text-ink-700">
          Loading the tanks…
        </p>
      ) : tanks.isError ? (
        <FieldError>The tanks could not be loaded; try again in a moment.</FieldError>
      ) : (
        <SelectField<TipFormValues>
          name="photoTankId"
          label="Tank"
          hint="Whose photos to choose from."
          className="sm:max-w-md"
          options={[
            { value: '', label: 'Choose a tank' },
            ...tanks.data.map((t) => ({
              value: t.id,
              label: t.siteLabel ? `${t.name} · ${t.siteLabel}` : t.name,
            })),
          ]}
        />
      )}
      {tank &&
        (photos.isPending ? (
          <p role="status" className="text-ink-700">
            Loading the photos of {tank.name}…
          </p>
        ) : photos.isError ? (
          <ErrorState
            error={photos.error}
            what={`the photos of ${tank.name}`}
            onRetry={() => void photos.refetch()}
          />
        ) : choices.length === 0 ? (
          <p className="text-ink-700">{tank.name} has no photos yet.</p>
        ) : (
          <RadioGroup<string>
            legend={`Photos of ${tank.name}`}
            look="photos"
            name={field.name}
            value={chosen ?? noPhoto}
            onChange={(value) => field.onChange(value === noPhoto ? null : value)}
            options={[
              {
                value: noPhoto,
                label: (
                  <span className="flex aspect-[4/3] items-center justify-center p-2 text-center font-bold">
                    No photo
                  </span>
                ),
              },
              ...choices.map((photo, index) => ({
                value: photo.id,
                label: (
                  <img
                    src={photo.thumbnailUrl}
                    alt={names[index]}
                    loading="lazy"
                    decoding="async"
                    className="aspect-[4/3] w-full bg-ink-100 object-cover"
                  />
                ),
              })),
            ]}
          />
        ))}
      {fieldState.error?.message && <FieldError>{fieldState.error.message}</FieldError>}
    </div>
  );
}
