import { useEffect, useId, useRef, useState } from 'react';
import { useController, useFormContext } from 'react-hook-form';
import { maxUrgentPhotos } from '@shared/schemas/urgent-requests';
import { Button } from '../../../components/button';
import { FieldError } from '../../../components/field-error';
import { ApiError } from '../../../lib/api-client';
import { useOnline } from '../../../lib/use-online';
import { uploadUrgentPhoto } from '../api/upload-urgent-photo';
import type { PhotoDraft, RequestFormValues } from '../utils/request-form';

const maxBytes = 10 * 1024 * 1024;

function uploadProblem(error: unknown): string {
  if (!(error instanceof ApiError) || error.status === 0)
    return 'Not uploaded: Brinewatch could not be reached.';
  if (error.status === 413) return 'Larger than 10 MB: choose a smaller photo.';
  return error.message || 'The photo could not be uploaded.';
}

/**
 * Up to five photos of the problem. Each is uploaded as soon as it is chosen; without a connection
 * the file waits in the form (and so in the copy kept on this device) and goes when the browser is
 * back online. The request names the uploaded photos by id.
 */
export function RequestPhotosField({ tankId }: { tankId: string }) {
  const id = useId();
  const online = useOnline();
  const { control, getValues, setValue, formState } = useFormContext<RequestFormValues>();
  const { field, fieldState } = useController({ control, name: 'photos' });
  // Taken apart first: the React Compiler's lint reads every property of an object holding a ref as a ref.
  const { ref, value: photos, onChange, onBlur } = field;
  const inFlight = useRef(new Set<string>());
  const [failed, setFailed] = useState<Readonly<Record<string, string>>>({});
  const [refused, setRefused] = useState<string | null>(null);
  // A file input cannot be cleared by value; a new key gives a fresh, empty one.
  const [inputKey, setInputKey] = useState(0);
  const isSubmitted = formState.isSubmitted;

  useEffect(() => {
    if (!online) return;
    const replace = (key: string, next: PhotoDraft) =>
      setValue(
        'photos',
        getValues('photos').map((photo) => (photo.key === key ? next : photo)),
        { shouldDirty: true, shouldValidate: isSubmitted },
      );
    for (const photo of photos) {
      if (photo.id || !photo.file || inFlight.current.has(photo.key) || failed[photo.key]) continue;
      inFlight.current.add(photo.key);
      uploadUrgentPhoto(tankId, photo.file, photo.name)
        .then((uploaded) =>
          replace(photo.key, { ...photo, id: uploaded.id, thumbnailUrl: uploaded.thumbnailUrl, file: null }),
        )
        .catch((error: unknown) => setFailed((now) => ({ ...now, [photo.key]: uploadProblem(error) })))
        .finally(() => inFlight.current.delete(photo.key));
    }
  }, [photos, online, failed, tankId, getValues, setValue, isSubmitted]);

  const room = maxUrgentPhotos - photos.length;
  const add = (files: FileList | null) => {
    const chosen = [...(files ?? [])];
    const tooBig = chosen.filter((file) => file.size > maxBytes);
    const fitting = chosen.filter((file) => file.size <= maxBytes).slice(0, Math.max(room, 0));
    const left = chosen.length - tooBig.length - fitting.length;
    setRefused(
      [
        tooBig.length > 0 ? `${tooBig.map((file) => file.name).join(', ')}: larger than 10 MB.` : '',
        left > 0 ? `Only ${maxUrgentPhotos} photos can go with a request.` : '',
      ]
        .filter(Boolean)
        .join(' ') || null,
    );
    onChange([
      ...photos,
      ...fitting.map((file): PhotoDraft => ({
        key: crypto.randomUUID(),
        name: file.name,
        id: null,
        thumbnailUrl: null,
        file,
      })),
    ]);
    setInputKey((key) => key + 1);
  };
  const remove = (key: string) => onChange(photos.filter((photo) => photo.key !== key));
  const retry = (key: string) =>
    setFailed((now) => Object.fromEntries(Object.entries(now).filter(([k]) => k !== key)));

  const error = fieldState.error?.message ?? fieldState.error?.root?.message;
  return (
    <div className="min-w-0">
      <label htmlFor={id} className="block font-bold text-ink-900">
        Photos (optional, up to {maxUrgentPhotos})
      </label>
      <p id={`${id}-hint`} className="mt-0.5 text-sm text-ink-700">
        The water level, the floor, the equipment’s lights. JPEG, PNG or WebP, up to 10 MB each.
      </p>
      <input
        key={inputKey}
        id={id}
        ref={ref}
        type="file"
        multiple
        accept="image/jpeg,image/png,image/webp"
        disabled={room <= 0}
        aria-describedby={`${id}-hint${error || refused ? ` ${id}-error` : ''}`}
        aria-invalid={error ? true : undefined}
        onChange={(event) => add(event.target.files)}
        onBlur={onBlur}
        className="mt-2 block min-h-12 w-full text-sm text-ink-950 file:mr-3 file:min-h-12 file:rounded-lg file:border-0 file:bg-ink-100 file:px-4 file:font-bold file:text-ink-900 disabled:opacity-60"
      />
      {(error || refused) && (
        <div id={`${id}-error`}>
          {refused && <FieldError className="mt-1">{refused}</FieldError>}
          {error && <FieldError className="mt-1">{error}</FieldError>}
        </div>
      )}
      {photos.length > 0 && (
        <ul aria-label="Photos to send" className="mt-3 grid grid-cols-2 gap-2 sm:grid-cols-3 lg:grid-cols-5">
          {photos.map((photo, index) => {
            const problem = failed[photo.key];
            const state = photo.id
              ? 'Uploaded'
              : problem
                ? problem
                : online
                  ? 'Uploading…'
                  : 'Waiting for a connection';
            return (
              <li
                key={photo.key}
                className="flex min-w-0 flex-col rounded-lg border-2 border-ink-100 bg-ink-50 p-2"
              >
                {photo.thumbnailUrl ? (
                  <img
                    src={photo.thumbnailUrl}
                    alt={`Attached ${index + 1} of ${photos.length}: ${photo.name}`}
                    className="aspect-square w-full rounded-md object-cover"
                  />
                ) : (
                  <div className="flex aspect-square w-full items-center justify-center rounded-md bg-white p-2 text-center text-xs break-all text-ink-700">
                    {photo.name}
                  </div>
                )}
                <p
                  className={`mt-1 text-xs font-bold ${problem ? 'text-alert-700' : 'text-ink-700'}`}
                  aria-live="polite"
                >
                  {state}
                </p>
                <div className="mt-1 flex flex-wrap gap-1">
                  {problem && (
                    <Button tone="secondary" className="px-2 text-sm" onClick={() => retry(photo.key)}>
                      Try again
                    </Button>
                  )}
                  <Button tone="secondary" className="px-2 text-sm" onClick={() => remove(photo.key)}>
                    Remove<span className="sr-only"> photo {index + 1}</span>
                  </Button>
                </div>
              </li>
            );
          })}
        </ul>
      )}
    </div>
  );
}
