declare module "s3rver" {
  import type { AddressInfo } from "node:net";
  export default class S3rver {
    constructor(options: { address?: string; port?: number; directory: string; silent?: boolean; configureBuckets?: { name: string; configs?: string[] }[] });
    run(): Promise<AddressInfo>;
    close(): Promise<void>;
  }
}
