import S3rver from 's3rver';
import { mkdir } from 'node:fs/promises';
import type { AddressInfo } from 'node:net';

export interface FakeS3 {
  endpoint: string;
  close(): Promise<void>;
}

/** A local S3-compatible store on loopback (s3rver), keeping objects in a folder. */
export async function startFakeS3(opts: { dir: string; bucket: string; port?: number }): Promise<FakeS3> {
  await mkdir(opts.dir, { recursive: true });
  const server = new S3rver({
    address: '127.0.0.1',
    port: opts.port ?? 0,
    directory: opts.dir,
    silent: true,
    configureBuckets: [{ name: opts.bucket, configs: [] }],
  });
  const addr = (await server.run()) as AddressInfo;
  return {
    endpoint: `http://127.0.0.1:${addr.port}`,
    close: () => server.close(),
  };
}
