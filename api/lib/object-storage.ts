import { randomUUID } from 'node:crypto';
import { Readable } from 'node:stream';
import {
  DeleteObjectCommand,
  GetObjectCommand,
  PutObjectCommand,
  S3Client,
  S3ServiceException,
} from '@aws-sdk/client-s3';
import type { Env } from '../env';
import { photoFormat } from './images';

/** One client for the hosted bucket and the local stand-in; only the configuration differs. */
export interface ObjectStorageConfig {
  /** Omitted for AWS itself; set for the stand-in or another S3-compatible service. */
  endpoint?: string;
  region: string;
  bucket: string;
  accessKeyId: string;
  secretAccessKey: string;
  /** True for the stand-in and most S3-compatible services (`endpoint/bucket/key` URLs). */
  forcePathStyle: boolean;
}

export interface StoredObject {
  /** Pipe it to the response; it holds a socket until read to the end or destroyed. */
  body: Readable;
  contentType: string;
  contentLength: number | undefined;
}

export interface ObjectStorage {
  put(key: string, body: Buffer, contentType: string): Promise<void>;
  /** Null when there is no object under the key. */
  get(key: string): Promise<StoredObject | null>;
  /** Succeeds whether or not the object existed, as S3 does. */
  delete(key: string): Promise<void>;
  close(): void;
}

export type PhotoKind = 'main' | 'thumbnail';

const kindPrefix: Record<PhotoKind, string> = { main: 'photos', thumbnail: 'thumbnails' };

/**
 * Keys are always made here, never from a file name a user sent, so they cannot collide,
 * traverse or leak anything. The month folder keeps listings and lifecycle rules manageable.
 */
export function newPhotoKey(kind: PhotoKind, at: Date = new Date()): string {
  const year = at.getUTCFullYear();
  const month = String(at.getUTCMonth() + 1).padStart(2, '0');
  return `${kindPrefix[kind]}/${year}/${month}/${randomUUID()}.${photoFormat.extension}`;
}

function isMissing(error: unknown): boolean {
  return error instanceof S3ServiceException && error.$metadata.httpStatusCode === 404;
}

export function createObjectStorage(config: ObjectStorageConfig): ObjectStorage {
  const client = new S3Client({
    ...(config.endpoint ? { endpoint: config.endpoint } : {}),
    region: config.region,
    forcePathStyle: config.forcePathStyle,
    credentials: { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey },
  });
  const Bucket = config.bucket;

  return {
    async put(key, body, contentType) {
      await client.send(
        new PutObjectCommand({
          Bucket,
          Key: key,
          Body: body,
          ContentType: contentType,
          ContentLength: body.length,
        }),
      );
    },

    async get(key) {
      try {
        const object = await client.send(new GetObjectCommand({ Bucket, Key: key }));
        if (!(object.Body instanceof Readable)) {
          throw new Error('The S3 client returned a body that is not a Node stream.');
        }
        return {
          body: object.Body,
          contentType: object.ContentType ?? 'application/octet-stream',
          contentLength: object.ContentLength,
        };
      } catch (error) {
        if (isMissing(error)) return null;
        throw error;
      }
    },

    async delete(key) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: key }));
    },

    close() {
      client.destroy();
    },
  };
}

/** The app's bucket as the environment names it (the app's deps, `npm start`'s seeding, the e2e set-up). */
export function objectStorageFromEnv(env: Env): ObjectStorage {
  return createObjectStorage({
    endpoint: env.S3_ENDPOINT,
    region: env.S3_REGION,
    bucket: env.S3_BUCKET,
    accessKeyId: env.S3_ACCESS_KEY_ID,
    secretAccessKey: env.S3_SECRET_ACCESS_KEY,
    forcePathStyle: true,
  });
}
