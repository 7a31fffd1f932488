/*
 * Where a photo is served. It lives below the request schemas so that domain code (the Markdown
 * renderer, which lets only our own photos become images) can know the shape without importing
 * shared/schemas.
 */

export const photoUrls = (id: string) => ({
  url: `/api/photos/${id}`,
  thumbnailUrl: `/api/photos/${id}/thumbnail`,
});

const ownPhotoPath =
  /^\/api\/photos\/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}(?:\/thumbnail)?$/i;

/** True for exactly the paths `photoUrls` makes: same origin, no query, nothing appended. */
export const isOwnPhotoUrl = (url: string): boolean => ownPhotoPath.test(url);
