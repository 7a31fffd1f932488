import { useId, useState } from 'react';
import { useController, useFormContext } from 'react-hook-form';
import { z } from 'zod';
import { photoUploadFields } from '@shared/schemas/photos';
import { ApiError } from '../lib/api-client';
import { blankAsUndefined } from '../lib/form-values';
import { useUploadPhoto } from '../lib/queries/photos';
import { Form, FormProblem, SubmitButton, useZodForm } from './form';
import { FieldError } from './field-error';
import { CheckboxField, TextField } from './form-fields';

const maxBytes = 10 * 1024 * 1024;
const tooLarge = 'That photo is larger than 10 MB. Choose a smaller one.';

const photoForm = z.object({
  photo: z
    .instanceof(File, { message: 'Choose a photo first.' })
    .refine((file) => file.size <= maxBytes, tooLarge),
  caption: blankAsUndefined(photoUploadFields.shape.caption),
  cover: z.boolean(),
});

/** What a refused upload means, in words about the photo rather than the request. */
function uploadMessage(error: unknown): string {
  if (!(error instanceof ApiError))
    return 'The photo could not be sent. Check your connection and try again.';
  if (error.status === 413) return tooLarge;
  if (error.status === 415) return error.message || 'Choose a JPEG, PNG or WebP photo.';
  if (error.status === 429) return error.message;
  return error.message || 'The photo could not be saved.';
}

/** The file input, bound to the form like the other fields; its error shows as soon as a file is chosen. */
function PhotoFileField({ label, resetKey }: { label: string; resetKey: number }) {
  const id = useId();
  const { control } = useFormContext<z.input<typeof photoForm>>();
  const {
    field: { ref, name, onChange, onBlur },
    fieldState,
  } = useController({ name: 'photo', control });
  const error = fieldState.error?.message;
  return (
    <div>
      <label htmlFor={id} className="block font-bold text-ink-900">
        {label}
      </label>
      <p id={`${id}-hint`} className="text-sm text-ink-700">
        JPEG, PNG or WebP, up to 10 MB. Location and camera details are removed.
      </p>
      <input
        key={resetKey}
        id={id}
        ref={ref}
        name={name}
        type="file"
        accept="image/jpeg,image/png,image/webp"
        aria-invalid={error ? true : undefined}
        aria-describedby={`${id}-hint${error ? ` ${id}-error` : ''}`}
        onChange={(event) => {
          onChange(event.target.files?.[0] ?? undefined);
          onBlur();
        }}
        className="mt-2 block min-h-11 w-full text-sm text-ink-950 file:mr-3 file:min-h-11 file:rounded-lg file:border-0 file:bg-ink-100 file:px-4 file:font-bold file:text-ink-900"
      />
      {error && (
        <FieldError id={`${id}-error`} className="mt-1">
          {error}
        </FieldError>
      )}
    </div>
  );
}

/** One photo at a time, with a caption; for the tank itself or for one animal in it. */
export function PhotoUploader({
  tankId,
  livestockId,
  offerCover = false,
  label = 'Add a photo',
}: {
  tankId: string;
  livestockId?: string;
  offerCover?: boolean;
  label?: string;
}) {
  const upload = useUploadPhoto(tankId);
  const [added, setAdded] = useState(false);
  // A file input cannot be cleared by value; a new key gives a fresh, empty one.
  const [resetKey, setResetKey] = useState(0);
  const form = useZodForm(photoForm, {
    defaultValues: { photo: undefined, caption: '', cover: false },
  });

  return (
    <Form
      form={form}
      className="space-y-3"
      aria-label={label}
      onChange={() => setAdded(false)}
      onSubmit={async ({ photo, caption, cover }) => {
        setAdded(false);
        try {
          await upload.mutateAsync({ file: photo, caption, livestockId, cover });
        } catch (error) {
          form.setError('root.server', { type: 'server', message: uploadMessage(error) });
          return;
        }
        form.reset();
        setResetKey((key) => key + 1);
        setAdded(true);
      }}
    >
      <PhotoFileField label={label} resetKey={resetKey} />
      <TextField name="caption" label="Caption (optional)" maxLength={300} />
      {offerCover && <CheckboxField name="cover" label="Use it as the tank's cover photo" />}
      <FormProblem className="text-sm" />
      {added && (
        <p role="status" className="text-sm font-bold text-healthy-700">
          Photo added.
        </p>
      )}
      <SubmitButton tone="secondary" pending="Uploading…">
        Upload photo
      </SubmitButton>
    </Form>
  );
}
