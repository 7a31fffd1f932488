/**
 * The part of s3rver 3 that the object-storage stand-in uses. The package ships no
 * declarations; if @types/s3rver ever becomes a dev dependency this file should be deleted
 * (an ambient module declaration would shadow the real one).
 */
declare module 's3rver' {
  import type { AddressInfo } from 'node:net';

  namespace S3rver {
    interface BucketConfig {
      name: string;
      /** CORS or website configuration documents (XML). */
      configs?: (string | Buffer)[];
    }

    interface Options {
      address?: string;
      port?: number;
      silent?: boolean;
      directory?: string;
      resetOnClose?: boolean;
      allowMismatchedSignatures?: boolean;
      vhostBuckets?: boolean;
      serviceEndpoint?: string;
      configureBuckets?: BucketConfig[];
    }
  }

  class S3rver {
    constructor(options?: S3rver.Options);
    /** Creates the configured buckets, then listens. */
    run(): Promise<AddressInfo>;
    close(): Promise<void>;
    reset(): void;
  }

  export = S3rver;
}
