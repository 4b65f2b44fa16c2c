declare module "s3rver" {
  import type { Server } from "node:http";
  type Options = { address?: string; port?: number; silent?: boolean; directory?: string; resetOnClose?: boolean; configureBuckets?: { name: string; configs?: (string | Buffer)[] }[] };
  export default class S3rver {
    constructor(options?: Options);
    run(): Promise<{ address: string; port: number }>;
    close(): Promise<void>;
    httpServer?: Server;
  }
}
