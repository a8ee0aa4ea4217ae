// s3rver ships no types: the little of it the tests use.
declare module "s3rver" {
  export default class S3rver {
    constructor(options: { port: number; address: string; directory: string; silent?: boolean; configureBuckets?: { name: string; configs: unknown[] }[] });
    run(): Promise<unknown>;
    close(): Promise<void>;
  }
}
