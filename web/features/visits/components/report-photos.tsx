import { useCallback, useEffect, useId, useRef, useState } from 'react';
import { useFieldArray } from 'react-hook-form';
import { photoUrls } from '@shared/schemas/photos';
import { photoPhases, type PhotoPhase } from '@shared/schemas/visits';
import { Button } from '../../../components/button';
import { ApiError } from '../../../lib/api-client';
import { forgetLocal, keepLocally, localKeys, readLocal } from '../../../lib/offline-store';
import { uploadPhoto } from '../../../lib/queries/photos';
import type { ReportFormValues } from '../utils/report-form';
import { SectionCard } from '../../../components/section-card';

/*
 * Before and after photos. A photo taken without a connection is kept on the phone (IndexedDB) and
 * uploaded when the connection returns; only then does it join the report, so the report never
 * names a photo the server does not have.
 */

interface WaitingPhoto {
  key: string;
  phase: PhotoPhase;
  url: string;
  problem: string | null;
}

interface KeptPhoto {
  blob: Blob;
  phase: PhotoPhase;
}

const phaseLabels: Record<PhotoPhase, string> = { before: 'Before', after: 'After' };
const maxBytes = 10 * 1024 * 1024;

export function PhotosSection({ tankId, visitId }: { tankId: string; visitId: string }) {
  const id = useId();
  const { fields, append, remove } = useFieldArray<ReportFormValues, 'photos'>({ name: 'photos' });
  const [waiting, setWaiting] = useState<WaitingPhoto[]>([]);
  const [problem, setProblem] = useState<string | null>(null);
  const uploading = useRef(new Set<string>());
  const prefix = `visit-photo:${visitId}:`;

  const upload = useCallback(
    async (key: string) => {
      if (uploading.current.has(key) || !navigator.onLine) return;
      uploading.current.add(key);
      try {
        const kept = await readLocal<KeptPhoto>(key);
        if (!kept) return;
        const photo = await uploadPhoto(tankId, { file: kept.blob, subject: 'visit' });
        append({ photoId: photo.id, phase: kept.phase });
        await forgetLocal(key);
        setWaiting((list) => list.filter((w) => w.key !== key));
      } catch (error) {
        // No connection: it waits. Refused (too big, not a picture): say so and let it be removed.
        if (error instanceof ApiError && error.status >= 400) {
          setWaiting((list) =>
            list.map((w) =>
              w.key === key ? { ...w, problem: error.message || 'This photo was refused.' } : w,
            ),
          );
        }
      } finally {
        uploading.current.delete(key);
      }
    },
    [append, tankId],
  );

  // Photos kept on this phone from an earlier session of this report.
  useEffect(() => {
    let live = true;
    void (async () => {
      const keys = await localKeys(prefix);
      const restored: WaitingPhoto[] = [];
      for (const key of keys) {
        const kept = await readLocal<KeptPhoto>(key);
        if (kept)
          restored.push({ key, phase: kept.phase, url: URL.createObjectURL(kept.blob), problem: null });
      }
      if (!live) return;
      setWaiting(restored);
      for (const photo of restored) void upload(photo.key);
    })();
    return () => {
      live = false;
    };
  }, [prefix, upload]);

  useEffect(() => {
    const online = () => waiting.forEach((photo) => void upload(photo.key));
    window.addEventListener('online', online);
    return () => window.removeEventListener('online', online);
  }, [upload, waiting]);

  const take = async (phase: PhotoPhase, file: File | undefined) => {
    setProblem(null);
    if (!file) return;
    if (file.size > maxBytes) {
      setProblem('That photo is larger than 10 MB. Choose a smaller one.');
      return;
    }
    const key = `${prefix}${crypto.randomUUID()}`;
    await keepLocally<KeptPhoto>(key, { blob: file, phase });
    setWaiting((list) => [...list, { key, phase, url: URL.createObjectURL(file), problem: null }]);
    void upload(key);
  };

  const discard = async (key: string) => {
    await forgetLocal(key);
    setWaiting((list) => list.filter((w) => w.key !== key));
  };

  return (
    <SectionCard title="Photos" hint="Before and after; owners see them once the report is published.">
      {(fields.length > 0 || waiting.length > 0) && (
        <ul className="grid grid-cols-2 gap-2 sm:grid-cols-4" aria-label="Report photos">
          {fields.map((field, index) => (
            <li key={field.id} className="overflow-hidden rounded-lg border border-ink-100">
              <img
                src={photoUrls(field.photoId).thumbnailUrl}
                alt={`${phaseLabels[field.phase]} the visit, ${index + 1}`}
                className="aspect-square w-full object-cover"
              />
              <div className="flex items-center justify-between gap-1 p-1.5">
                <span className="text-sm font-bold text-ink-900">{phaseLabels[field.phase]}</span>
                <Button tone="secondary" className="min-h-11 px-2 text-sm" onClick={() => remove(index)}>
                  Remove
                </Button>
              </div>
            </li>
          ))}
          {waiting.map((photo) => (
            <li key={photo.key} className="overflow-hidden rounded-lg border border-dashed border-ink-300">
              <img
                src={photo.url}
                alt={`${phaseLabels[photo.phase]} the visit, waiting to upload`}
                className="aspect-square w-full object-cover opacity-70"
              />
              <div className="grid gap-1 p-1.5 text-sm">
                <span className="font-bold text-ink-900">{phaseLabels[photo.phase]}</span>
                {photo.problem ? (
                  <>
                    <span className="text-alert-700">{photo.problem}</span>
                    <Button
                      tone="secondary"
                      className="min-h-11 px-2 text-sm"
                      onClick={() => void discard(photo.key)}
                    >
                      Remove
                    </Button>
                  </>
                ) : (
                  <span className="text-ink-700">Kept on this phone; uploads when online</span>
                )}
              </div>
            </li>
          ))}
        </ul>
      )}
      <div className="grid grid-cols-2 gap-2">
        {photoPhases.map((phase) => (
          <label
            key={phase}
            htmlFor={`${id}-${phase}`}
            className="inline-flex min-h-12 cursor-pointer items-center justify-center rounded-lg border-2 border-ink-300 bg-white px-3 font-bold text-ink-900 has-focus-visible:outline-3 has-focus-visible:outline-brine-500"
          >
            {phaseLabels[phase]} photo
            <input
              id={`${id}-${phase}`}
              type="file"
              accept="image/jpeg,image/png,image/webp"
              capture="environment"
              className="sr-only"
              onChange={(event) => {
                void take(phase, event.target.files?.[0]);
                event.target.value = '';
              }}
            />
          </label>
        ))}
      </div>
      {problem && (
        <p role="alert" className="font-bold text-alert-700">
          {problem}
        </p>
      )}
    </SectionCard>
  );
}
