import { useId, useRef, useState, type FormEvent } from 'react';
import { Button } from '../../../components/button';
import { CheckboxField, FieldError, TextField } from '../../../components/form-fields';
import { ApiError } from '../../../lib/api-client';
import { useUploadPhoto } from '../api/upload-photo';

const maxBytes = 10 * 1024 * 1024;

function uploadMessage(error: unknown): string {
  if (!(error instanceof ApiError))
    return 'The photo could not be sent. Check your connection and try again.';
  if (error.status === 413) return 'That photo is larger than 10 MB. Choose a smaller one.';
  if (error.status === 415) return error.message || 'Choose a JPEG, PNG or WebP photo.';
  if (error.status === 429) return error.message;
  return error.message || 'The photo could not be saved.';
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
  const fileId = useId();
  const fileInput = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [caption, setCaption] = useState('');
  const [cover, setCover] = useState(false);
  const [tooLarge, setTooLarge] = useState(false);
  const upload = useUploadPhoto(tankId);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (!file || tooLarge) return;
    upload.mutate(
      { file, caption: caption.trim() || undefined, livestockId, cover },
      {
        onSuccess: () => {
          setFile(null);
          setCaption('');
          setCover(false);
          if (fileInput.current) fileInput.current.value = '';
        },
      },
    );
  };

  return (
    <form onSubmit={submit} className="space-y-3" aria-label={label}>
      <div>
        <label htmlFor={fileId} className="block font-bold text-ink-900">
          {label}
        </label>
        <p id={`${fileId}-hint`} className="text-sm text-ink-700">
          JPEG, PNG or WebP, up to 10 MB. Location and camera details are removed.
        </p>
        <input
          id={fileId}
          ref={fileInput}
          type="file"
          accept="image/jpeg,image/png,image/webp"
          aria-describedby={`${fileId}-hint`}
          onChange={(event) => {
            const chosen = event.target.files?.[0] ?? null;
            setFile(chosen);
            setTooLarge(chosen !== null && chosen.size > maxBytes);
            upload.reset();
          }}
          className="mt-2 block min-h-11 w-full text-sm text-ink-950 file:mr-3 file:min-h-11 file:rounded-lg file:border-0 file:bg-ink-100 file:px-4 file:font-bold file:text-ink-900"
        />
        {tooLarge && (
          <FieldError className="mt-1">That photo is larger than 10 MB. Choose a smaller one.</FieldError>
        )}
      </div>
      <TextField label="Caption (optional)" value={caption} onChange={setCaption} maxLength={300} />
      {offerCover && (
        <CheckboxField label="Use it as the tank's cover photo" checked={cover} onChange={setCover} />
      )}
      {upload.isError && (
        <p role="alert" className="text-sm font-bold text-alert-700">
          {uploadMessage(upload.error)}
        </p>
      )}
      {upload.isSuccess && (
        <p role="status" className="text-sm font-bold text-healthy-700">
          Photo added.
        </p>
      )}
      <Button type="submit" tone="secondary" disabled={!file || tooLarge || upload.isPending}>
        {upload.isPending ? 'Uploading…' : 'Upload photo'}
      </Button>
    </form>
  );
}
