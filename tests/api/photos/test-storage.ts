import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startObjectStorage, type RunningObjectStorage } from '../../../api/dev/object-storage';
import { createObjectStorage, type ObjectStorage } from '../../../api/lib/object-storage';

export interface TestStorage {
  standIn: RunningObjectStorage;
  storage: ObjectStorage;
  dir: string;
  close(): Promise<void>;
}

/** The s3rver stand-in on a free port in a fresh temp folder, and a client configured for it. */
export async function startTestStorage(): Promise<TestStorage> {
  const dir = await mkdtemp(join(tmpdir(), 'brinewatch-s3-'));
  const standIn = await startObjectStorage({ host: '127.0.0.1', port: 0, dir, bucket: 'tank-photos' });
  const storage = createObjectStorage({
    endpoint: standIn.endpoint,
    region: 'us-east-1',
    bucket: standIn.bucket,
    accessKeyId: standIn.accessKeyId,
    secretAccessKey: standIn.secretAccessKey,
    forcePathStyle: true,
  });
  return {
    standIn,
    storage,
    dir,
    async close() {
      storage.close();
      await standIn.close();
      await rm(dir, { recursive: true, force: true });
    },
  };
}
