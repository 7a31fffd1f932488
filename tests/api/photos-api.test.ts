import { eq } from 'drizzle-orm';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PhotoItem } from '@shared/schemas/photos';
import type { LivestockItem } from '@shared/schemas/livestock';
import type { TankSummary } from '@shared/schemas/tanks';
import { photos, tanks } from '../../api/db/schema/index';
import { maxPhotoBytes } from '../../api/middleware/photo-upload';
import { uploadsPerWindow } from '../../api/routes/photos';
import { issuePaths, signedIn, type ApiSession } from '../helpers/api-session';
import { addLivestockTo, createCompany, createPerson, createTank } from '../helpers/factories';
import { startTestStack, type TestStack } from '../helpers/stack';
import {
  exifHasGps,
  makeImage,
  makePhoneJpeg,
  svgDrawing,
  textPretendingToBePng,
} from './photos/test-images';

type Tank = { id: string; companyId: string };

function form(file: Buffer, name: string, type: string, fields: Record<string, string> = {}) {
  const body = new FormData();
  for (const [key, value] of Object.entries(fields)) body.append(key, value);
  body.append('photo', new Blob([new Uint8Array(file)], { type }), name);
  return body;
}

describe('photos API', () => {
  let stack: TestStack;
  let technician: ApiSession;
  let owner: ApiSession;
  let strangerOwner: ApiSession;
  let otherAdmin: ApiSession;
  let tank: Tank;
  let secondTank: Tank;
  let png: Buffer;

  beforeAll(async () => {
    stack = await startTestStack();
    const { db } = stack.database;
    const issuer = stack.idp.issuer;
    const company = await createCompany(db);
    const other = await createCompany(db);
    const ownerPerson = await createPerson(db, { companyId: company.id, role: 'owner', issuer });
    tank = await createTank(db, { companyId: company.id, owners: [ownerPerson] });
    secondTank = await createTank(db, { companyId: company.id });
    technician = await signedIn(
      stack,
      await createPerson(db, { companyId: company.id, role: 'technician', issuer }),
    );
    owner = await signedIn(stack, ownerPerson);
    strangerOwner = await signedIn(
      stack,
      await createPerson(db, { companyId: company.id, role: 'owner', issuer }),
    );
    otherAdmin = await signedIn(
      stack,
      await createPerson(db, { companyId: other.id, role: 'admin', issuer }),
    );
    png = await makeImage({ width: 800, height: 600, format: 'png' });
  });
  afterAll(() => stack.close());

  const upload = (who: ApiSession, body: FormData, target: Tank = tank) =>
    who.upload<PhotoItem>(`/api/tanks/${target.id}/photos`, body);

  describe('POST /api/tanks/:tankId/photos', () => {
    it('accepts a PNG, re-encodes it as WebP and serves it back through the API', async () => {
      const res = await upload(
        technician,
        form(png, 'tank.png', 'image/png', { caption: 'After the rescape' }),
      );

      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({
        tankId: tank.id,
        livestockId: null,
        subject: 'tank',
        width: 800,
        height: 600,
        caption: 'After the rescape',
        url: `/api/photos/${res.body.id}`,
        thumbnailUrl: `/api/photos/${res.body.id}/thumbnail`,
      });
      const main = await owner.get(res.body.url);
      const thumbnail = await owner.get(res.body.thumbnailUrl);
      expect(main.status).toBe(200);
      expect(main.headers.get('content-type')).toBe('image/webp');
      expect(main.headers.get('x-content-type-options')).toBe('nosniff');
      expect(main.headers.get('cache-control')).toBe('private, max-age=31536000, immutable');
      expect((await sharp(main.bytes).metadata()).format).toBe('webp');
      expect(await sharp(thumbnail.bytes).metadata()).toMatchObject({
        format: 'webp',
        width: 480,
        height: 360,
      });
    });

    it('takes the GPS position and camera data out of a phone JPEG', async () => {
      const jpeg = await makePhoneJpeg();
      const original = await sharp(jpeg).metadata();
      expect(exifHasGps(original.exif!)).toBe(true);

      const res = await upload(technician, form(jpeg, 'IMG_2041.JPG', 'image/jpeg'));
      const served = await technician.get(res.body.url);

      expect(res.status).toBe(201);
      const metadata = await sharp(served.bytes).metadata();
      expect(metadata.format).toBe('webp');
      expect(metadata.exif).toBeUndefined();
      expect(served.bytes.includes(Buffer.from('Brinewatch Test Camera'))).toBe(false);
    });

    it('refuses a text file named .png and an SVG drawing with 415', async () => {
      const text = await upload(technician, form(textPretendingToBePng, 'readings.png', 'image/png'));
      const svg = await upload(technician, form(svgDrawing, 'coral.svg', 'image/svg+xml'));

      expect(text.status).toBe(415);
      expect(svg.status).toBe(415);
      expect(svg.body).toMatchObject({ error: { code: 'unsupported_image' } });
    });

    it('refuses a file over 10 MB with 413', async () => {
      const res = await upload(
        technician,
        form(Buffer.alloc(maxPhotoBytes + 1, 0xab), 'huge.jpg', 'image/jpeg'),
      );

      expect(res.status).toBe(413);
    });

    it('attaches a photo to an animal in the tank, but not to one in another tank', async () => {
      const { db } = stack.database;
      const clownfish = await addLivestockTo(db, tank, { catalogueSpeciesId: 'ocellaris-clownfish' });
      const elsewhere = await addLivestockTo(db, secondTank, { catalogueSpeciesId: 'green-chromis' });

      const ok = await upload(technician, form(png, 'nemo.png', 'image/png', { livestockId: clownfish.id }));
      const wrong = await upload(technician, form(png, 'x.png', 'image/png', { livestockId: elsewhere.id }));
      const [listed] = (await owner.get<LivestockItem[]>(`/api/tanks/${tank.id}/livestock`)).body;

      expect(ok.status).toBe(201);
      expect(ok.body).toMatchObject({ subject: 'livestock', livestockId: clownfish.id });
      expect(listed!.photos.map((photo) => photo.id)).toEqual([ok.body.id]);
      expect(wrong.status).toBe(400);
      expect(issuePaths(wrong.body)).toEqual(['body.livestockId']);
    });

    it("makes an upload the tank's cover when asked, shown in the tank list", async () => {
      const res = await upload(technician, form(png, 'cover.png', 'image/png', { cover: 'true' }));
      const [listed] = (await owner.get<TankSummary[]>('/api/tanks')).body;

      expect(res.status).toBe(201);
      expect(listed!.coverPhoto).toMatchObject({ id: res.body.id, thumbnailUrl: res.body.thumbnailUrl });
    });

    it('sets an earlier photo as the cover through the tank', async () => {
      const first = await upload(technician, form(png, 'first.png', 'image/png'));

      const res = await technician.patch<TankSummary>(`/api/tanks/${tank.id}`, {
        coverPhotoId: first.body.id,
      });

      expect(res.body.coverPhoto?.id).toBe(first.body.id);
    });

    it('is for staff only, and another company cannot upload to our tank', async () => {
      expect((await upload(owner, form(png, 'mine.png', 'image/png'))).status).toBe(403);
      expect((await upload(otherAdmin, form(png, 'theirs.png', 'image/png'))).status).toBe(404);
    });

    it('limits how many photos one person uploads in ten minutes, with Retry-After', async () => {
      const busy = await signedIn(
        stack,
        await createPerson(stack.database.db, {
          companyId: tank.companyId,
          role: 'technician',
          issuer: stack.idp.issuer,
        }),
      );
      // Refused files count too: decoding is the cost the budget protects.
      for (let i = 0; i < uploadsPerWindow.points; i++) {
        expect((await upload(busy, form(textPretendingToBePng, 'x.png', 'image/png'))).status).toBe(415);
      }

      const res = await upload(busy, form(png, 'one-more.png', 'image/png'));

      expect(res.status).toBe(429);
      expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(500);
      expect((res.body as unknown as { error: { code: string } }).error.code).toBe('rate_limited');
      expect((await upload(technician, form(png, 'someone-else.png', 'image/png'))).status).toBe(201);
    });
  });

  describe('GET /api/photos/:photoId', () => {
    let photo: PhotoItem;
    beforeAll(async () => {
      photo = (await upload(technician, form(png, 'private.png', 'image/png'))).body;
    });

    it('answers 404 to an owner of another tank and to another company, as for a missing photo', async () => {
      const missing = await owner.get('/api/photos/00000000-0000-4000-8000-000000000000');
      const stranger = await strangerOwner.get(photo.url);
      const strangerThumb = await strangerOwner.get(photo.thumbnailUrl);
      const foreign = await otherAdmin.get(photo.url);

      expect([stranger.status, strangerThumb.status, foreign.status]).toEqual([404, 404, 404]);
      expect(stranger.body).toEqual(missing.body);
    });

    it("lists a tank's photos for those who may see the tank", async () => {
      const mine = await owner.get<PhotoItem[]>(`/api/tanks/${tank.id}/photos`);

      expect(mine.status).toBe(200);
      expect(mine.body.map((item) => item.id)).toContain(photo.id);
      expect((await strangerOwner.get(`/api/tanks/${tank.id}/photos`)).status).toBe(404);
    });
  });

  describe('DELETE /api/photos/:photoId', () => {
    it('deletes the photo and its stored files; a cover photo leaves the tank without one', async () => {
      const res = await upload(technician, form(png, 'gone.png', 'image/png', { cover: 'true' }));
      const [row] = await stack.database.db.select().from(photos).where(eq(photos.id, res.body.id));

      const deleted = await technician.delete(`/api/photos/${res.body.id}`);

      expect(deleted.status).toBe(204);
      expect((await technician.get(res.body.url)).status).toBe(404);
      expect(await stack.deps.storage.get(row!.objectKey)).toBeNull();
      expect(await stack.deps.storage.get(row!.thumbnailKey)).toBeNull();
      const [after] = await stack.database.db.select().from(tanks).where(eq(tanks.id, tank.id));
      expect(after!.coverPhotoId).toBeNull();
    });

    it("refuses owners, and answers another company's admin with 404, keeping the photo", async () => {
      const res = await upload(technician, form(png, 'keep.png', 'image/png'));

      expect((await owner.delete(`/api/photos/${res.body.id}`)).status).toBe(403);
      expect((await otherAdmin.delete(`/api/photos/${res.body.id}`)).status).toBe(404);
      expect((await owner.get(res.body.url)).status).toBe(200);
    });

    it('goes with the animal when a livestock entry is deleted', async () => {
      const animal = await addLivestockTo(stack.database.db, tank, { catalogueSpeciesId: 'firefish' });
      const res = await upload(
        technician,
        form(png, 'firefish.png', 'image/png', { livestockId: animal.id }),
      );
      const [row] = await stack.database.db.select().from(photos).where(eq(photos.id, res.body.id));

      await technician.delete(`/api/tanks/${tank.id}/livestock/${animal.id}`);

      expect((await technician.get(res.body.url)).status).toBe(404);
      expect(await stack.deps.storage.get(row!.objectKey)).toBeNull();
    });
  });
});
