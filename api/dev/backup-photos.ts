import { mkdir, readFile, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { GetObjectCommand, ListObjectsV2Command, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { loadEnvOrExit, type Env } from '../env';
import { isMain } from '../lib/is-main';

/**
 * Copies every object of the photo bucket to a folder (`backup`) or a folder back into the bucket
 * (`restore`), over the S3 API, so it works against the demo's stand-in and any S3-compatible
 * service alike. Keys become relative paths; content types travel in `.content-types.json`.
 *
 *   npx tsx api/dev/backup-photos.ts backup backups/photos
 *   npx tsx api/dev/backup-photos.ts restore backups/photos
 */

type BucketConfig = Pick<
  Env,
  'S3_ENDPOINT' | 'S3_REGION' | 'S3_BUCKET' | 'S3_ACCESS_KEY_ID' | 'S3_SECRET_ACCESS_KEY'
>;

const typesFile = '.content-types.json';

function clientFor(env: BucketConfig) {
  return new S3Client({
    endpoint: env.S3_ENDPOINT,
    region: env.S3_REGION,
    forcePathStyle: true,
    credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
  });
}

/** A key as a path inside `dir`; a key that would leave the folder is refused. */
function fileFor(dir: string, key: string): string {
  const file = path.resolve(dir, key);
  if (!file.startsWith(path.resolve(dir) + path.sep)) throw new Error(`Refusing object key ${key}`);
  return file;
}

/** Returns how many objects were written to `dir`. */
export async function backupPhotos(env: BucketConfig, dir: string): Promise<number> {
  const client = clientFor(env);
  const types: Record<string, string> = {};
  let token: string | undefined;
  try {
    do {
      const page = await client.send(
        new ListObjectsV2Command({ Bucket: env.S3_BUCKET, ContinuationToken: token }),
      );
      for (const { Key } of page.Contents ?? []) {
        if (!Key) continue;
        const object = await client.send(new GetObjectCommand({ Bucket: env.S3_BUCKET, Key }));
        const file = fileFor(dir, Key);
        await mkdir(path.dirname(file), { recursive: true });
        await writeFile(file, await object.Body!.transformToByteArray());
        types[Key] = object.ContentType ?? 'application/octet-stream';
      }
      token = page.NextContinuationToken;
    } while (token);
  } finally {
    client.destroy();
  }
  await mkdir(dir, { recursive: true });
  await writeFile(path.join(dir, typesFile), JSON.stringify(types, null, 2));
  return Object.keys(types).length;
}

/** Puts every object listed in the backup back into the bucket; returns how many. */
export async function restorePhotos(env: BucketConfig, dir: string): Promise<number> {
  const types = JSON.parse(await readFile(path.join(dir, typesFile), 'utf8')) as Record<string, string>;
  const client = clientFor(env);
  try {
    for (const [Key, ContentType] of Object.entries(types)) {
      const Body = await readFile(fileFor(dir, Key));
      await client.send(
        new PutObjectCommand({ Bucket: env.S3_BUCKET, Key, Body, ContentType, ContentLength: Body.length }),
      );
    }
  } finally {
    client.destroy();
  }
  return Object.keys(types).length;
}

async function main() {
  const [command, dir] = process.argv.slice(2);
  if ((command !== 'backup' && command !== 'restore') || !dir) {
    console.error('Usage: tsx api/dev/backup-photos.ts backup|restore <folder>');
    process.exit(2);
  }
  const env = loadEnvOrExit();
  const count = command === 'backup' ? await backupPhotos(env, dir) : await restorePhotos(env, dir);
  console.log(`${command === 'backup' ? 'Backed up' : 'Restored'} ${count} objects (${dir}).`);
}

if (isMain(import.meta.url)) await main();
