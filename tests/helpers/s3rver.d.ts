/** The parts of s3rver (a local S3-compatible server, test-only) that the storage tests use; it ships no types. */
declare module "s3rver" {
  interface S3rverOptions {
    address?: string;
    /** 0 picks a free port (run() resolves with the real one). */
    port?: number;
    silent?: boolean;
    directory?: string;
    resetOnClose?: boolean;
    allowMismatchedSignatures?: boolean;
    vhostBuckets?: boolean;
    configureBuckets?: Array<{ name: string; configs?: Array<string | Buffer> }>;
  }
  export default class S3rver {
    constructor(options?: S3rverOptions);
    run(): Promise<{ address: string; family: string; port: number }>;
    close(): Promise<void>;
  }
}
