/**
 * Raw trace files in object storage through the S3 API (any S3-compatible store; s3rver locally).
 *
 * Objects are content-addressed: `traces/sha256/<hex>`. The checksum is only known once the last
 * byte has streamed through, so an upload first goes (multipart, through lib-storage) to a
 * staging key and is then copied to its content address. A refused or failed upload never ends
 * its body: the multipart upload is aborted and the staging key deleted, so nothing is left.
 */
import { randomUUID } from 'node:crypto';
import { once } from 'node:events';
import { PassThrough, type Readable } from 'node:stream';
import {
  CopyObjectCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';

export interface TraceStoreConfig {
  readonly endpoint: string;
  readonly region: string;
  readonly bucket: string;
  readonly accessKeyId: string;
  readonly secretAccessKey: string;
  /** Path-style URLs (required by s3rver and most self-hosted stores). */
  readonly forcePathStyle?: boolean;
}

export const TRACE_KEY_PREFIX = 'traces/sha256/';
const STAGING_PREFIX = 'traces/staging/';
/** S3's smallest part size: the least memory held per upload (parts in flight × part size). */
const PART_SIZE = 5 * 1024 * 1024;
const QUEUE_SIZE = 2;

export function traceObjectKey(sha256Hex: string): string {
  if (!/^[0-9a-f]{64}$/.test(sha256Hex)) throw new Error(`not a SHA-256 hex digest: ${sha256Hex}`);
  return TRACE_KEY_PREFIX + sha256Hex;
}

/** A streaming upload to a staging key: write chunks, then either `commit` or `discard`. */
export interface StagedUpload {
  /** Writes one chunk, waiting while the store is behind (backpressure). */
  write(chunk: Buffer): Promise<void>;
  /** Ends the body, waits for the upload, and moves the object to its content address. */
  commit(sha256Hex: string): Promise<{ key: string }>;
  /** Aborts: the multipart upload is abandoned and nothing remains under any key. */
  discard(): Promise<void>;
}

export class TraceObjectStore {
  readonly client: S3Client;

  constructor(
    private readonly config: TraceStoreConfig,
    client?: S3Client,
  ) {
    this.client =
      client ??
      new S3Client({
        endpoint: config.endpoint,
        region: config.region,
        forcePathStyle: config.forcePathStyle ?? true,
        credentials: { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey },
        // Integrity is the SHA-256 we compute ourselves; skipping the SDK's extra CRC32 of every
        // part saves ~10 % of an upload's CPU.
        requestChecksumCalculation: 'WHEN_REQUIRED',
        responseChecksumValidation: 'WHEN_REQUIRED',
      });
    if (!client) {
      // Parts are not hashed a second time for the request signature: the signature covers the
      // headers (UNSIGNED-PAYLOAD, allowed by S3 SigV4); the content is checked by its SHA-256 key.
      this.client.middlewareStack.add(
        (next) => async (args) => {
          const request = args.request as { headers?: Record<string, string> };
          if (request.headers) request.headers['x-amz-content-sha256'] = 'UNSIGNED-PAYLOAD';
          return next(args);
        },
        { step: 'build', name: 'gapwiseUnsignedPayload' },
      );
    }
  }

  get bucket(): string {
    return this.config.bucket;
  }

  beginUpload(contentType = 'application/octet-stream'): StagedUpload {
    const stagingKey = `${STAGING_PREFIX}${randomUUID()}`;
    const body = new PassThrough({ highWaterMark: 1024 * 1024 });
    const upload = new Upload({
      client: this.client,
      params: { Bucket: this.bucket, Key: stagingKey, Body: body, ContentType: contentType },
      partSize: PART_SIZE,
      queueSize: QUEUE_SIZE,
      leavePartsOnError: false,
    });
    let failure: unknown = null;
    const done = upload.done().then(
      () => undefined,
      (error: unknown) => {
        failure = error;
      },
    );
    let settled = false;
    const cleanUp = async () => {
      if (!body.destroyed) body.destroy(new Error('upload discarded'));
      await done;
      await this.deleteQuietly(stagingKey);
    };
    return {
      write: async (chunk) => {
        if (failure) throw failure;
        if (!body.write(chunk)) {
          await Promise.race([once(body, 'drain'), done.then(() => undefined)]);
          if (failure) throw failure;
        }
      },
      commit: async (sha256Hex) => {
        if (settled) throw new Error('staged upload already settled');
        settled = true;
        body.end();
        await done;
        if (failure) {
          await this.deleteQuietly(stagingKey);
          throw failure;
        }
        const key = traceObjectKey(sha256Hex);
        try {
          if (!(await this.exists(key))) {
            await this.client.send(
              new CopyObjectCommand({
                Bucket: this.bucket,
                Key: key,
                CopySource: `${this.bucket}/${stagingKey}`,
                ContentType: contentType,
                MetadataDirective: 'REPLACE',
                Metadata: { sha256: sha256Hex },
              }),
            );
          }
        } finally {
          await this.deleteQuietly(stagingKey);
        }
        return { key };
      },
      discard: async () => {
        if (settled) return;
        settled = true;
        await cleanUp();
      },
    };
  }

  /** Streams an object back (for the analysis worker and downloads). */
  async open(key: string): Promise<Readable> {
    const got = await this.client.send(new GetObjectCommand({ Bucket: this.bucket, Key: key }));
    return got.Body as Readable;
  }

  async exists(key: string): Promise<boolean> {
    try {
      await this.client.send(new HeadObjectCommand({ Bucket: this.bucket, Key: key }));
      return true;
    } catch (error) {
      const status = (error as { $metadata?: { httpStatusCode?: number } }).$metadata
        ?.httpStatusCode;
      if (
        status === 404 ||
        (error as Error).name === 'NotFound' ||
        (error as Error).name === 'NoSuchKey'
      )
        return false;
      throw error;
    }
  }

  async delete(key: string): Promise<void> {
    await this.client.send(new DeleteObjectCommand({ Bucket: this.bucket, Key: key }));
  }

  private async deleteQuietly(key: string): Promise<void> {
    try {
      await this.delete(key);
    } catch {
      // Best effort: a staging object that was never created answers 404 on some stores.
    }
  }

  destroy(): void {
    this.client.destroy();
  }
}
