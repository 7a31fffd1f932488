import { readdir } from 'node:fs/promises';
import { join } from 'node:path';
import { text } from 'node:stream/consumers';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startObjectStorage } from '../../../api/dev/object-storage';
import { createObjectStorage, newPhotoKey } from '../../../api/lib/object-storage';
import { startTestStorage, type TestStorage } from './test-storage';

describe('object storage through the s3rver stand-in', () => {
  let s3: TestStorage;
  beforeAll(async () => {
    s3 = await startTestStorage();
  });
  afterAll(() => s3.close());

  it('stores an object and reads it back with its type and length', async () => {
    const key = newPhotoKey('main');
    const body = Buffer.from('not really a photo, but bytes are bytes');

    await s3.storage.put(key, body, 'image/webp');
    const stored = await s3.storage.get(key);

    expect(stored).toMatchObject({ contentType: 'image/webp', contentLength: body.length });
    expect(await text(stored!.body)).toBe(body.toString());
  });

  it('round-trips binary content byte for byte', async () => {
    const key = newPhotoKey('thumbnail');
    const body = Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 37) % 256));

    await s3.storage.put(key, body, 'image/webp');
    const stored = await s3.storage.get(key);

    const chunks: Buffer[] = [];
    for await (const chunk of stored!.body) chunks.push(chunk as Buffer);
    expect(Buffer.concat(chunks).equals(body)).toBe(true);
  });

  it('answers null for a key that holds nothing', async () => {
    expect(await s3.storage.get(newPhotoKey('main'))).toBeNull();
  });

  it('deletes an object, and deleting it again is not an error', async () => {
    const key = newPhotoKey('main');
    await s3.storage.put(key, Buffer.from('gone soon'), 'image/webp');

    await s3.storage.delete(key);

    expect(await s3.storage.get(key)).toBeNull();
    await expect(s3.storage.delete(key)).resolves.toBeUndefined();
  });

  it('keeps the bucket as files in the folder it was given', async () => {
    await s3.storage.put(newPhotoKey('main'), Buffer.from('on disk'), 'image/webp');

    expect(await readdir(s3.dir)).toContain('tank-photos');
    expect(await readdir(join(s3.dir, 'tank-photos'), { recursive: true })).not.toHaveLength(0);
  });

  it('refuses a client with an unknown access key', async () => {
    const stranger = createObjectStorage({
      endpoint: s3.standIn.endpoint,
      region: 'us-east-1',
      bucket: s3.standIn.bucket,
      accessKeyId: 'SOMEONE-ELSE',
      secretAccessKey: s3.standIn.secretAccessKey,
      forcePathStyle: true,
    });
    try {
      await expect(stranger.put(newPhotoKey('main'), Buffer.from('x'), 'image/webp')).rejects.toThrow(
        /Access Key Id/,
      );
    } finally {
      stranger.close();
    }
  });
});

describe('startObjectStorage', () => {
  it('keeps stored objects across a restart on the same folder', async () => {
    const first = await startTestStorage();
    const key = newPhotoKey('main');
    await first.storage.put(key, Buffer.from('still here'), 'image/webp');
    first.storage.close();
    await first.standIn.close();

    const again = await startObjectStorage({ port: 0, dir: first.dir, bucket: first.standIn.bucket });
    const storage = createObjectStorage({
      endpoint: again.endpoint,
      region: 'us-east-1',
      bucket: again.bucket,
      accessKeyId: again.accessKeyId,
      secretAccessKey: again.secretAccessKey,
      forcePathStyle: true,
    });
    try {
      const stored = await storage.get(key);
      expect(stored && (await text(stored.body))).toBe('still here');
    } finally {
      storage.close();
      await again.close();
      await first.close();
    }
  });

  it('listens on loopback only', async () => {
    await expect(
      startObjectStorage({ host: '0.0.0.0', port: 0, dir: '/tmp/never-created', bucket: 'b' }),
    ).rejects.toThrow(/loopback/);
  });
});

describe('newPhotoKey', () => {
  it('files a photo under its year and month with a fresh id', () => {
    const at = new Date('2026-12-03T09:30:00Z');

    const key = newPhotoKey('main', at);

    expect(key).toMatch(/^photos\/2026\/12\/[0-9a-f-]{36}\.webp$/);
    expect(newPhotoKey('main', at)).not.toBe(key);
  });

  it('keeps thumbnails apart from full-size photos', () => {
    expect(newPhotoKey('thumbnail', new Date('2027-01-31T23:59:59Z'))).toMatch(
      /^thumbnails\/2027\/01\/[0-9a-f-]{36}\.webp$/,
    );
  });
});
