// s3rver 3.7.1 ships no types; the part the photo storage test uses.
declare module 's3rver' {
  export default class S3rver {
    constructor(options: { address?: string; port?: number; silent?: boolean; directory?: string; resetOnClose?: boolean; configureBuckets?: { name: string; configs: (string | Buffer)[] }[] });
    run(): Promise<unknown>;
    close(): Promise<void>;
  }
}
