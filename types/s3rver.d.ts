declare module "s3rver" {
  type BucketConfig = { name: string; configs?: (string | Buffer)[] };
  type Options = {
    address?: string;
    port?: number;
    directory?: string;
    silent?: boolean;
    resetOnClose?: boolean;
    configureBuckets?: BucketConfig[];
  };
  export default class S3rver {
    constructor(options: Options);
    run(): Promise<{ address: string; port: number }>;
    close(): Promise<void>;
  }
}
