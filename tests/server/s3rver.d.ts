// s3rver 3.x ships no types; only what the tests use is declared.
declare module 's3rver' {
  type Options = { address?: string; port?: number; silent?: boolean; directory: string; configureBuckets?: { name: string }[]; resetOnClose?: boolean };
  export default class S3rver {
    constructor(options: Options);
    run(): Promise<{ address: string; port: number }>;
    close(): Promise<void>;
  }
}
