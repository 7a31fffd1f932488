import { useState } from 'react';
import type { TankDetail } from '@shared/schemas/tanks';
import { Button } from '../../../components/button';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { problemMessage } from '../../../lib/problem-message';
import { ErrorState, LoadingState } from '../../../components/states';
import { useDeletePhoto } from '../api/delete-photo';
import { useTankPhotos } from '../../../lib/queries/photos';
import { useUpdateTank } from '../api/update-tank';
import { PhotoUploader } from '../../../components/photo-uploader';

/** The tank's photos for staff: add one, choose the cover, delete what should not be there. */
export function TankPhotos({ tank }: { tank: TankDetail }) {
  const photos = useTankPhotos(tank.id);
  const updateTank = useUpdateTank(tank.id);
  const deletePhoto = useDeletePhoto();
  const [deleting, setDeleting] = useState<{ id: string; what: string } | null>(null);
  const closeDialog = () => {
    setDeleting(null);
    deletePhoto.reset();
  };
  return (
    <section aria-labelledby="photos-title" className="space-y-4 rounded-card bg-white p-5 shadow-card">
      <h2 id="photos-title" className="text-xl font-bold text-ink-900">
        Photos
      </h2>
      <PhotoUploader tankId={tank.id} offerCover label="Add a photo of the tank" />
      {photos.isPending ? (
        <LoadingState label="Loading photos…" />
      ) : photos.isError ? (
        <ErrorState error={photos.error} what="the photos" onRetry={() => void photos.refetch()} />
      ) : photos.data.length === 0 ? (
        <p className="text-sm text-ink-700">No photos yet.</p>
      ) : (
        <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4">
          {photos.data.map((photo) => {
            const isCover = tank.coverPhoto?.id === photo.id;
            const what = photo.caption ?? (photo.subject === 'livestock' ? 'Livestock photo' : 'Tank photo');
            return (
              <li key={photo.id} className="overflow-hidden rounded-lg border border-ink-100">
                <img
                  src={photo.thumbnailUrl}
                  alt={what}
                  className="aspect-[4/3] w-full bg-ink-100 object-cover"
                  loading="lazy"
                />
                <div className="space-y-1 p-2">
                  <p className="truncate text-sm text-ink-950">{what}</p>
                  {isCover ? (
                    <p className="flex min-h-11 items-center text-sm font-bold text-healthy-700">
                      Cover photo
                    </p>
                  ) : (
                    <Button
                      tone="secondary"
                      className="w-full text-sm"
                      disabled={updateTank.isPending}
                      onClick={() => updateTank.mutate({ coverPhotoId: photo.id })}
                    >
                      Use as cover<span className="sr-only">: {what}</span>
                    </Button>
                  )}
                  <Button
                    tone="secondary"
                    className="w-full text-sm text-alert-700"
                    disabled={deletePhoto.isPending}
                    onClick={() => {
                      deletePhoto.reset();
                      setDeleting({ id: photo.id, what });
                    }}
                  >
                    Delete<span className="sr-only"> photo: {what}</span>
                  </Button>
                </div>
              </li>
            );
          })}
        </ul>
      )}
      <ConfirmDialog
        open={deleting !== null}
        title="Delete this photo?"
        confirmLabel="Delete photo"
        pendingLabel="Deleting…"
        pending={deletePhoto.isPending}
        error={deletePhoto.isError ? problemMessage(deletePhoto.error) : undefined}
        onClose={closeDialog}
        onConfirm={() => {
          if (deleting) deletePhoto.mutate(deleting.id, { onSuccess: closeDialog });
        }}
      >
        <p>{deleting?.what}: deleting it cannot be undone.</p>
      </ConfirmDialog>
    </section>
  );
}
