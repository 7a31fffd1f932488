import { z } from 'zod';

export const photoIdParams = z.object({ photoId: z.uuid() });

/** The text fields sent beside the file in the multipart form; they arrive as strings. */
export const photoUploadFields = z.object({
  livestockId: z.uuid().optional(),
  caption: z.string().trim().max(300).optional(),
  /** "visit": taken for a visit report; owners see it once a published report uses it. */
  subject: z.enum(['tank', 'visit']).optional(),
  /** "true" makes it the tank's cover photo. */
  cover: z
    .enum(['true', 'false'])
    .default('false')
    .transform((value) => value === 'true'),
});

export const photoItem = z.object({
  id: z.uuid(),
  tankId: z.uuid(),
  livestockId: z.uuid().nullable(),
  subject: z.enum(['tank', 'livestock', 'visit', 'message']),
  url: z.string(),
  thumbnailUrl: z.string(),
  width: z.int(),
  height: z.int(),
  caption: z.string().nullable(),
  uploadedAt: z.iso.datetime(),
});
export type PhotoItem = z.infer<typeof photoItem>;

export { photoUrls } from '@shared/photos/urls';
