/**
 * A local S3-compatible object store (s3rver) on 127.0.0.1 for development and tests.
 * Clients use `endpoint`, `region: 'us-east-1'`, `forcePathStyle: true` and the credentials
 * S3RVER / S3RVER.
 */
import { mkdir } from 'node:fs/promises';
import S3rver from 's3rver';

export interface ObjectStoreOptions {
  /** Port on 127.0.0.1; 0 picks a free one. */
  readonly port: number;
  /** Folder that holds the buckets and objects. */
  readonly directory: string;
  /** Bucket created when missing; default `gapwise`. */
  readonly bucket?: string;
}

export interface ObjectStore {
  readonly port: number;
  readonly endpoint: string;
  readonly bucket: string;
  readonly region: 'us-east-1';
  readonly credentials: { readonly accessKeyId: 'S3RVER'; readonly secretAccessKey: 'S3RVER' };
  stop(): Promise<void>;
}

export async function startObjectStore(options: ObjectStoreOptions): Promise<ObjectStore> {
  const bucket = options.bucket ?? 'gapwise';
  await mkdir(options.directory, { recursive: true });
  const server = new S3rver({
    port: options.port,
    address: '127.0.0.1',
    silent: true,
    directory: options.directory,
    configureBuckets: [{ name: bucket }],
  });
  const { port } = await server.run();
  return {
    port,
    endpoint: `http://127.0.0.1:${port}`,
    bucket,
    region: 'us-east-1',
    credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
    stop: () => server.close(),
  };
}
