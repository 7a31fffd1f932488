import { eq } from 'drizzle-orm';
import sharp from 'sharp';
import type { ObjectStorage } from '../../lib/object-storage';
import type { Db } from '../../db/client';
import { photos, tanks } from '../../db/schema/index';
import { storePhotoObjects } from '../../services/photos';
import { livestockPortraitSvg, tankSceneSvg } from './pictures';
import { demoLivestock, demoTanks } from './scenario';

interface DemoPhoto {
  id: string;
  companyId: string;
  tankId: string;
  livestockId: string | null;
  caption: string;
  svg: () => string;
  cover: boolean;
}

async function isStored(storage: ObjectStorage, key: string): Promise<boolean> {
  const object = await storage.get(key);
  object?.body.destroy();
  return object !== null;
}

/**
 * Draws each demo photo and stores it the way an upload is stored (`storePhotoObjects`). A photo already in the database and in storage is left alone, so a second
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
      (await isStored(storage, existing.objectKey)) &&
      (await isStored(storage, existing.thumbnailKey))
    ) {
      continue;
    }
    const png = await sharp(Buffer.from(photo.svg())).png().toBuffer();
    const stored = await storePhotoObjects(storage, png, new Date());
    const row = {
      id: photo.id,
      companyId: photo.companyId,
      tankId: photo.tankId,
      livestockId: photo.livestockId,
      subject: photo.livestockId ? ('livestock' as const) : ('tank' as const),
      ...stored,
      caption: photo.caption,
      uploadedBy: ids.uploadedBy,
    };
    await db.insert(photos).values(row).onConflictDoUpdate({ target: photos.id, set: row });
    if (photo.cover) await db.update(tanks).set({ coverPhotoId: photo.id }).where(eq(tanks.id, photo.tankId));
  }
}
