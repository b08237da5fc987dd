// s3rver 3.7 ships no types: the part of its API the cluster script and the storage tests use.
declare module "s3rver" {
  type Options = {
    address?: string;
    port?: number;
    silent?: boolean;
    directory: string;
    resetOnClose?: boolean;
    configureBuckets?: { name: string; configs: (string | Buffer)[] }[];
  };
  export default class S3rver {
    constructor(options: Options);
    run(): Promise<{ address: string; port: number }>;
    close(): Promise<void>;
  }
}
