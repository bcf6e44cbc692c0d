declare module 's3rver' {
  type Options = {
    port?: number;
    address?: string;
    silent?: boolean;
    directory?: string;
    configureBuckets?: { name: string; configs: (string | Buffer)[] }[];
  };
  export default class S3rver {
    constructor(options: Options);
    run(): Promise<unknown>;
    close(): Promise<void>;
  }
}
