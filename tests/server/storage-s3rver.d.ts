/** The part of s3rver (a local fake S3 server, devDependency without type declarations) the storage tests use. */
declare module 's3rver' {
  interface S3rverOptions {
    address?: string;
    port?: number;
    silent?: boolean;
    directory?: string;
    resetOnClose?: boolean;
    configureBuckets?: Array<{ name: string; configs?: Array<string | Buffer> }>;
  }
  export default class S3rver {
    constructor(options?: S3rverOptions);
    run(): Promise<{ address: string; port: number }>;
    close(): Promise<void>;
  }
}
