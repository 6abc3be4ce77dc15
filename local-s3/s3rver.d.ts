// The part of s3rver (which ships no types) that local-s3/server.mjs uses.
declare module 's3rver' {
  interface BucketConfig {
    name: string;
    /** Bucket configuration documents, e.g. a CORS configuration XML. */
    configs?: (string | Buffer)[];
  }

  interface S3rverOptions {
    port?: number;
    address?: string;
    directory?: string;
    silent?: boolean;
    configureBuckets?: BucketConfig[];
  }

  export default class S3rver {
    constructor(options?: S3rverOptions);
    run(): Promise<unknown>;
    close(): Promise<void>;
  }
}
