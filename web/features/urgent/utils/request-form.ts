import { z } from 'zod';
import { maxUrgentPhotos, urgentRequestInput } from '@shared/schemas/urgent-requests';
import { urgentCategories } from '@shared/urgent/categories';
import { blankAsNull } from '../../../lib/form-values';

/*
 * The new-request form: the shared `urgentRequestInput` with the photos held as they are chosen
 * (a file still waiting to upload, or the uploaded photo), the equipment picker's "not listed" as
 * blank, and plain words for a choice not made yet. It hands `onSubmit` the request the API checks
 * again; the call-out fee the owner saw is added there, from the settings on screen.
 */

const fields = urgentRequestInput.shape;

/** One photo of the problem: a file kept on this device until it is uploaded, then the photo's id. */
export const photoDraft = z.object({
  key: z.string(),
  name: z.string(),
  /** Set once uploaded; until then the file waits here (and in the device's store). */
  id: z.uuid().nullable(),
  thumbnailUrl: z.string().nullable(),
  file: z.instanceof(Blob).nullable(),
});
export type PhotoDraft = z.infer<typeof photoDraft>;

export const requestFormSchema = urgentRequestInput
  .omit({ photoIds: true, acceptedCallOutFeeCents: true })
  .extend({
    category: z.enum(urgentCategories, { error: 'Choose what is happening.' }),
    equipmentId: blankAsNull(fields.equipmentId),
    someoneOnSite: z.boolean({ error: 'Say whether someone is with the tank now.' }),
    photos: z
      .array(photoDraft)
      .max(maxUrgentPhotos, `At most ${maxUrgentPhotos} photos.`)
      .refine((photos) => photos.every((photo) => photo.id !== null), {
        message: 'A photo is still waiting to upload. Send once it has, or remove it.',
      }),
  })
  .transform(({ photos, ...request }) => ({
    ...request,
    equipmentId: request.category === 'equipment' ? request.equipmentId : null,
    photoIds: photos.map((photo) => photo.id!),
  }));

export type RequestFormValues = z.input<typeof requestFormSchema>;

export const emptyRequestForm = (): RequestFormValues => ({
  category: '' as RequestFormValues['category'],
  equipmentId: '',
  description: '',
  photos: [],
  someoneOnSite: undefined as unknown as boolean,
  access: '',
  phone: '',
  bestTime: '',
});

/** Nothing typed or chosen yet: there is nothing worth keeping. */
export function isBlankRequest(values: RequestFormValues): boolean {
  return (
    !values.category &&
    !values.equipmentId &&
    (values.photos?.length ?? 0) === 0 &&
    values.someoneOnSite === undefined &&
    [values.description, values.access, values.phone, values.bestTime].every((text) => !text?.trim())
  );
}

/** What this device keeps of a request not sent yet, one per tank. */
export interface RequestDraft {
  values: RequestFormValues;
  savedAt: string;
}

export const requestDraftKey = (tankId: string) => `urgent-draft:${tankId}`;

/** The API's `photoIds` issues belong to the photos field. */
export function requestFieldFor(path: string): string | null {
  if (path.startsWith('photoIds')) return 'photos';
  if (path === 'acceptedCallOutFeeCents') return null;
  return path.split('.')[0] ?? null;
}
