import { and, asc, eq, exists, ne, notInArray, or, sql, type SQL } from 'drizzle-orm';
import { photoUrls, type PhotoItem } from '@shared/schemas/photos';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import {
  careTips,
  careTipTanks,
  conversationMessages,
  livestock,
  messagePhotos,
  photos,
  tanks,
  urgentRequestPhotos,
  visitPhotos,
} from '../db/schema/index';
import { processUpload } from '../lib/images';
import { newPhotoKey, type ObjectStorage, type StoredObject } from '../lib/object-storage';
import type { Logger } from '../lib/logger';
import { notFound } from '../lib/http-error';
import { findTankFor, isStaff, visibleTanks } from '../policy/index';
import type { Actor } from './actors';
import { recordAudit, type AuditSource } from './audit';
import { invalidFields } from './tanks';

type PhotoRow = typeof photos.$inferSelect;

export function photoItemOf(row: PhotoRow): PhotoItem {
  return {
    id: row.id,
    tankId: row.tankId,
    livestockId: row.livestockId,
    subject: row.subject,
    ...photoUrls(row.id),
    width: row.width,
    height: row.height,
    caption: row.caption,
    uploadedAt: row.createdAt.toISOString(),
  };
}

/**
 * Re-encodes an image (dropping everything the camera wrote) and stores both sizes under new keys;
 * returns the columns a photo row needs about them. Uploads and the demo scenario both use it.
 */
export async function storePhotoObjects(storage: ObjectStorage, bytes: Buffer, at: Date) {
  const { main, thumbnail } = await processUpload(bytes);
  const objectKey = newPhotoKey('main', at);
  const thumbnailKey = newPhotoKey('thumbnail', at);
  await Promise.all([
    storage.put(objectKey, main.buffer, main.contentType),
    storage.put(thumbnailKey, thumbnail.buffer, thumbnail.contentType),
  ]);
  return {
    objectKey,
    thumbnailKey,
    contentType: main.contentType,
    width: main.width,
    height: main.height,
    bytes: main.buffer.length,
  };
}

export interface PhotoUpload {
  bytes: Buffer;
  livestockId?: string;
  caption?: string;
  cover: boolean;
  /** 'message': for a conversation or an urgent request, the one kind owners may upload too. */
  subject?: 'tank' | 'visit' | 'message';
}

/** Stores the upload's objects, then records it: the objects come first so a row never points at nothing. */
export async function uploadPhoto(
  deps: Pick<AppDeps, 'db' | 'storage' | 'clock'>,
  actor: Actor,
  tankId: string,
  upload: PhotoUpload,
): Promise<PhotoItem> {
  const { db, storage, clock } = deps;
  const tank = await findTankFor(db, actor, tankId, upload.subject === 'message' ? 'read' : 'write');
  if (upload.livestockId) {
    const [animal] = await db
      .select({ id: livestock.id })
      .from(livestock)
      .where(and(eq(livestock.id, upload.livestockId), eq(livestock.tankId, tank.id)));
    if (!animal)
      throw invalidFields([{ path: 'body.livestockId', message: 'choose livestock in this tank' }]);
  }
  const stored = await storePhotoObjects(storage, upload.bytes, clock());
  try {
    const row = await db.transaction(async (tx) => {
      const [created] = await tx
        .insert(photos)
        .values({
          companyId: tank.companyId,
          tankId: tank.id,
          livestockId: upload.livestockId ?? null,
          subject: upload.livestockId ? 'livestock' : (upload.subject ?? 'tank'),
          ...stored,
          caption: upload.caption || null,
          uploadedBy: actor.id,
        })
        .returning();
      if (upload.cover)
        await tx.update(tanks).set({ coverPhotoId: created!.id }).where(eq(tanks.id, tank.id));
      return created!;
    });
    return photoItemOf(row);
  } catch (error) {
    // Nothing refers to the objects yet; leaving them would only fill the bucket.
    await Promise.allSettled([storage.delete(stored.objectKey), storage.delete(stored.thumbnailKey)]);
    throw error;
  }
}

/**
 * A photo uploaded for a message or an urgent request and not attached to either yet. A photo
 * belongs to one line or one request only: attaching a note's photo to something owners read
 * would show them the note's picture.
 */
export function unattachedPhoto(): SQL {
  return and(
    sql`not exists (select 1 from ${messagePhotos} where ${messagePhotos.photoId} = ${photos.id})`,
    sql`not exists (select 1 from ${urgentRequestPhotos} where ${urgentRequestPhotos.photoId} = ${photos.id})`,
  )!;
}

/**
 * Owners see a visit's photos only once a published report uses them, and a conversation's photos
 * once they are in a message (never an internal note) or an urgent request, or when they took them;
 * staff see every photo of their company's tanks.
 */
function shownTo(actor: Actor): SQL | undefined {
  if (isStaff(actor)) return undefined;
  const published = exists(
    sql`(select 1 from ${visitPhotos} where ${visitPhotos.photoId} = ${photos.id} and ${visitPhotos.published})`,
  );
  const inMessage = exists(
    sql`(select 1 from ${messagePhotos} join ${conversationMessages} on ${conversationMessages.id} = ${messagePhotos.messageId}
      where ${messagePhotos.photoId} = ${photos.id} and ${conversationMessages.kind} = 'message')`,
  );
  const inUrgentRequest = exists(
    sql`(select 1 from ${urgentRequestPhotos} where ${urgentRequestPhotos.photoId} = ${photos.id})`,
  );
  return or(
    notInArray(photos.subject, ['visit', 'message']),
    and(eq(photos.subject, 'visit'), published),
    and(eq(photos.subject, 'message'), or(eq(photos.uploadedBy, actor.id), inMessage, inUrgentRequest)),
  );
}

export async function listTankPhotos(db: Db, actor: Actor, tankId: string): Promise<PhotoItem[]> {
  const tank = await findTankFor(db, actor, tankId, 'read');
  const rows = await db
    .select()
    .from(photos)
    .where(and(eq(photos.tankId, tank.id), shownTo(actor)))
    .orderBy(asc(photos.createdAt), asc(photos.id));
  return rows.map(photoItemOf);
}

/**
 * A care tip's photo is also shown to whoever the tip reached (a tank they see received it, and it
 * was not withdrawn), though it was taken at another tank.
 */
function onTipReaching(db: Db, actor: Actor): SQL {
  const reached = db
    .select({ one: sql`1` })
    .from(careTips)
    .innerJoin(careTipTanks, eq(careTipTanks.tipId, careTips.id))
    .innerJoin(tanks, eq(tanks.id, careTipTanks.tankId))
    .where(and(eq(careTips.photoId, photos.id), ne(careTips.status, 'withdrawn'), visibleTanks(db, actor)));
  return exists(reached);
}

/** A photo under exactly its tank's access rule: anyone who cannot see the tank gets a 404. */
async function findVisiblePhoto(db: Db, actor: Actor, photoId: string): Promise<PhotoRow> {
  const [row] = await db
    .select({ photo: photos })
    .from(photos)
    .innerJoin(tanks, eq(tanks.id, photos.tankId))
    .where(
      and(eq(photos.id, photoId), or(and(visibleTanks(db, actor), shownTo(actor)), onTipReaching(db, actor))),
    );
  if (!row) throw notFound('photo');
  return row.photo;
}

export async function openPhoto(
  deps: Pick<AppDeps, 'db' | 'storage'>,
  actor: Actor,
  photoId: string,
  size: 'main' | 'thumbnail',
): Promise<StoredObject> {
  const photo = await findVisiblePhoto(deps.db, actor, photoId);
  const stored = await deps.storage.get(size === 'main' ? photo.objectKey : photo.thumbnailKey);
  if (!stored) throw notFound('photo');
  return stored;
}

export async function deletePhoto(
  deps: Pick<AppDeps, 'db' | 'storage' | 'logger'>,
  actor: Actor,
  photoId: string,
  source: AuditSource,
): Promise<void> {
  const photo = await findVisiblePhoto(deps.db, actor, photoId);
  const tank = await findTankFor(deps.db, actor, photo.tankId, 'write');
  await deps.db.transaction(async (tx) => {
    await tx.delete(photos).where(eq(photos.id, photo.id));
    await recordAudit(tx, {
      companyId: tank.companyId,
      actor,
      action: 'photo.deleted',
      target: {
        kind: 'photo',
        id: photo.id,
        label: photo.caption ? `${photo.caption} (${tank.name})` : tank.name,
      },
      details: { tank: tank.name, uploadedAt: photo.createdAt.toISOString() },
      source,
    });
  });
  await discardObjects(deps.storage, deps.logger, [photo.objectKey, photo.thumbnailKey]);
}

/**
 * After the rows are gone the objects are unreachable, so a failure to delete one is logged for
 * clean-up rather than reported to someone whose deletion has already happened.
 */
export async function discardObjects(storage: ObjectStorage, logger: Logger, keys: string[]): Promise<void> {
  const results = await Promise.allSettled(keys.map((key) => storage.delete(key)));
  results.forEach((result, index) => {
    if (result.status === 'rejected') {
      logger.warn({ err: result.reason, key: keys[index] }, 'could not delete a stored photo');
    }
  });
}
