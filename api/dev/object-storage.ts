import { mkdir } from 'node:fs/promises';
import S3rver from 's3rver';

/**
 * Stand-in for the hosted object storage: s3rver on loopback, keeping objects as files under
 * `dir` so that photos survive a restart of `npm start`. The app talks to it with the same
 * S3 client and code it uses for a real bucket.
 *
 * s3rver also answers unsigned requests; keep photos behind the API rather than relying on
 * the bucket to refuse strangers.
 */

export interface ObjectStorageOptions {
  host?: string;
  /** 0 picks a free port. */
  port: number;
  /** Folder for the stored objects, e.g. `.data/s3`; created when missing. */
  dir: string;
  bucket: string;
}

export interface RunningObjectStorage {
  /** Base URL for the S3 client, e.g. `http://127.0.0.1:4568` (use path-style addressing). */
  endpoint: string;
  bucket: string;
  accessKeyId: string;
  secretAccessKey: string;
  close(): Promise<void>;
}

const loopbackHosts = new Set(['127.0.0.1', '::1', 'localhost']);

// s3rver's built-in account. It refuses other access key ids but does not check SigV4
// signatures, so a wrong secret goes unnoticed here and only shows against a real bucket.
const credentials = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' };

export async function startObjectStorage(options: ObjectStorageOptions): Promise<RunningObjectStorage> {
  const host = options.host ?? '127.0.0.1';
  if (!loopbackHosts.has(host)) {
    throw new Error(`The object-storage stand-in listens on loopback only, not on ${host}.`);
  }
  await mkdir(options.dir, { recursive: true });

  const server = new S3rver({
    address: host,
    port: options.port,
    directory: options.dir,
    silent: true,
    // The client always uses path-style URLs; without this s3rver would read a host name
    // such as "localhost.localdomain" as a bucket name.
    vhostBuckets: false,
    configureBuckets: [{ name: options.bucket }],
  });
  const address = await server.run();
  const urlHost = address.family === 'IPv6' ? `[${address.address}]` : address.address;

  let closed: Promise<void> | null = null;
  return {
    endpoint: `http://${urlHost}:${address.port}`,
    bucket: options.bucket,
    ...credentials,
    close: () => (closed ??= server.close()),
  };
}
