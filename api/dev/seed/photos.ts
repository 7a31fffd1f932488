import { eq } from 'drizzle-orm';
import sharp from 'sharp';
import type { Env } from '../../env';
import { processUpload } from '../../lib/images';
import { createObjectStorage, newPhotoKey, type ObjectStorage } from '../../lib/object-storage';
import type { Db } from '../../db/client';
import { photos, tanks } from '../../db/schema/index';
import { livestockPortraitSvg, tankSceneSvg } from './pictures';
import { demoLivestock, demoTanks } from './scenario';

/** The bucket the app uses, for seeding from outside the app (npm start, the e2e set-up). */
export function objectStorageFor(env: Env): ObjectStorage {
  return createObjectStorage({
    endpoint: env.S3_ENDPOINT,
    region: env.S3_REGION,
    bucket: env.S3_BUCKET,
    accessKeyId: env.S3_ACCESS_KEY_ID,
    secretAccessKey: env.S3_SECRET_ACCESS_KEY,
    forcePathStyle: true,
  });
}

interface DemoPhoto {
  id: string;
  companyId: string;
  tankId: string;
  livestockId: string | null;
  caption: string;
  svg: () => string;
  cover: boolean;
}

async function stored(storage: ObjectStorage, key: string): Promise<boolean> {
  const object = await storage.get(key);
  object?.body.destroy();
  return object !== null;
}

/**
 * Draws each demo photo and stores it the way an upload is stored (re-encoded, keys made by
 * `newPhotoKey`). A photo already in the database and in storage is left alone, so a second
 * seed renders nothing.
 */
export async function seedDemoPhotos(
  db: Db,
  storage: ObjectStorage,
  ids: {
    companyId: string;
    tankId: (key: string) => string;
    livestockId: (tank: string, key: string) => string;
    photoId: (key: string) => string;
    uploadedBy: string;
  },
): Promise<void> {
  const wanted: DemoPhoto[] = demoTanks.flatMap((tank) => [
    {
      id: ids.photoId(`${tank.key}:cover`),
      companyId: ids.companyId,
      tankId: ids.tankId(tank.key),
      livestockId: null,
      caption: `${tank.name} after the last visit`,
      svg: () => tankSceneSvg(tank.key, tank.style),
      cover: true,
    },
    ...demoLivestock[tank.key]
      .filter((animal) => animal.photo)
      .map((animal) => ({
        id: ids.photoId(`${tank.key}:${animal.key}`),
        companyId: ids.companyId,
        tankId: ids.tankId(tank.key),
        livestockId: ids.livestockId(tank.key, animal.key),
        caption: animal.nickname ? `${animal.nickname}` : 'Photographed at the last visit',
        svg: () => livestockPortraitSvg(animal.speciesId),
        cover: false,
      })),
  ]);

  for (const photo of wanted) {
    const [existing] = await db.select().from(photos).where(eq(photos.id, photo.id));
    if (
      existing &&
      (await stored(storage, existing.objectKey)) &&
      (await stored(storage, existing.thumbnailKey))
    ) {
      continue;
    }
    const png = await sharp(Buffer.from(photo.svg())).png().toBuffer();
    const { main, thumbnail } = await processUpload(png);
    const objectKey = newPhotoKey('main');
    const thumbnailKey = newPhotoKey('thumbnail');
    await storage.put(objectKey, main.buffer, main.contentType);
    await storage.put(thumbnailKey, thumbnail.buffer, thumbnail.contentType);
    const row = {
      id: photo.id,
      companyId: photo.companyId,
      tankId: photo.tankId,
      livestockId: photo.livestockId,
      subject: photo.livestockId ? ('livestock' as const) : ('tank' as const),
      objectKey,
      thumbnailKey,
      contentType: main.contentType,
      width: main.width,
      height: main.height,
      bytes: main.buffer.length,
      caption: photo.caption,
      uploadedBy: ids.uploadedBy,
    };
    await db.insert(photos).values(row).onConflictDoUpdate({ target: photos.id, set: row });
    if (photo.cover) await db.update(tanks).set({ coverPhotoId: photo.id }).where(eq(tanks.id, photo.tankId));
  }
}
