import { chmod, mkdtemp, readFile, stat, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import webpush from 'web-push';
import { beforeEach, describe, expect, it } from 'vitest';
import { loadOrCreateVapidKeys } from '../../../api/lib/vapid-keys';

describe('loadOrCreateVapidKeys', () => {
  let dir: string;

  beforeEach(async () => {
    dir = join(await mkdtemp(join(tmpdir(), 'brinewatch-vapid-')), 'nested');
  });

  it('makes a P-256 key pair at first start and keeps it in vapid.json, readable by the owner only', async () => {
    const keys = await loadOrCreateVapidKeys(dir);

    expect(Buffer.from(keys.publicKey, 'base64url')).toHaveLength(65);
    expect(Buffer.from(keys.privateKey, 'base64url')).toHaveLength(32);
    expect(JSON.parse(await readFile(join(dir, 'vapid.json'), 'utf8'))).toEqual(keys);
    expect((await stat(join(dir, 'vapid.json'))).mode & 0o777).toBe(0o600);
  });

  it('returns the same keys on the next start', async () => {
    const first = await loadOrCreateVapidKeys(dir);

    expect(await loadOrCreateVapidKeys(dir)).toEqual(first);
  });

  it('keeps one key pair when two processes start together', async () => {
    const [a, b] = await Promise.all([loadOrCreateVapidKeys(dir), loadOrCreateVapidKeys(dir)]);

    expect(a).toEqual(b);
  });

  it('makes a kept file readable by the owner only', async () => {
    await loadOrCreateVapidKeys(dir);
    await chmod(join(dir, 'vapid.json'), 0o644);

    await loadOrCreateVapidKeys(dir);

    expect((await stat(join(dir, 'vapid.json'))).mode & 0o777).toBe(0o600);
  });

  it('refuses a file whose public key does not belong to its private key, rather than replacing it', async () => {
    await loadOrCreateVapidKeys(dir);
    const mixed = {
      publicKey: webpush.generateVAPIDKeys().publicKey,
      privateKey: webpush.generateVAPIDKeys().privateKey,
    };
    await writeFile(join(dir, 'vapid.json'), JSON.stringify(mixed));

    await expect(loadOrCreateVapidKeys(dir)).rejects.toThrow(/matching P-256 key pair/);
    expect(JSON.parse(await readFile(join(dir, 'vapid.json'), 'utf8'))).toEqual(mixed);
  });

  it('refuses a file that is not JSON', async () => {
    await loadOrCreateVapidKeys(dir);
    await writeFile(join(dir, 'vapid.json'), 'publicKey=abc');

    await expect(loadOrCreateVapidKeys(dir)).rejects.toThrow(/not JSON/);
  });
});
