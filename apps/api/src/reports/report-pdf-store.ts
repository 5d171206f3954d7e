/**
 * Where generated report PDFs are kept: the same S3-API object storage as the trace files.
 *
 * A PDF is rendered once per report revision and stored under
 * `reports/<snapshotId>/r<revision>.pdf`; every later download of that revision returns the
 * stored bytes, so the document a reviewer approved is the document downloaded afterwards (an
 * approved report never gets a new revision). Rendering is also deterministic (fixed creation
 * date, no random ids), so without a configured store the same bytes are regenerated.
 */
import { GetObjectCommand, NoSuchKey, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import type { ObjectStoreConfig } from '../config';

export interface ReportPdfStore {
  get(key: string): Promise<Buffer | null>;
  put(key: string, pdf: Buffer): Promise<void>;
}

export function reportPdfKey(snapshotId: string, revision: number): string {
  if (!/^[0-9a-f]{64}$/.test(snapshotId)) throw new Error(`not a snapshot id: ${snapshotId}`);
  return `reports/${snapshotId}/r${revision}.pdf`;
}

export interface S3StoreConfig {
  readonly endpoint: string;
  readonly region: string;
  readonly bucket: string;
  readonly accessKeyId: string;
  readonly secretAccessKey: string;
}

export class S3ReportPdfStore implements ReportPdfStore {
  private readonly client: S3Client;
  constructor(private readonly config: S3StoreConfig) {
    this.client = new S3Client({
      endpoint: config.endpoint,
      region: config.region,
      forcePathStyle: true,
      credentials: { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey },
    });
  }

  async get(key: string): Promise<Buffer | null> {
    try {
      const out = await this.client.send(
        new GetObjectCommand({ Bucket: this.config.bucket, Key: key }),
      );
      if (!out.Body) return null;
      return Buffer.from(await out.Body.transformToByteArray());
    } catch (error) {
      if (error instanceof NoSuchKey || (error as { name?: string }).name === 'NoSuchKey')
        return null;
      throw error;
    }
  }

  async put(key: string, pdf: Buffer): Promise<void> {
    await this.client.send(
      new PutObjectCommand({
        Bucket: this.config.bucket,
        Key: key,
        Body: pdf,
        ContentType: 'application/pdf',
      }),
    );
  }
}

/**
 * The store of the configuration's object store (S3_* variables, config.ts). Null when
 * S3_ENDPOINT is unset: PDFs are then regenerated on download.
 */
export function reportPdfStoreFor(objectStore: ObjectStoreConfig): ReportPdfStore | null {
  if (!objectStore.endpointSet) return null;
  return new S3ReportPdfStore(objectStore);
}
