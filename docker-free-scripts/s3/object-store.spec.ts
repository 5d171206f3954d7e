import {
  GetObjectCommand,
  ListBucketsCommand,
  PutObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startObjectStore, type ObjectStore } from './object-store.ts';

describe('local object store', () => {
  let directory: string;
  let store: ObjectStore;
  let client: S3Client;

  beforeAll(async () => {
    directory = await mkdtemp(join(tmpdir(), 'gapwise-s3-'));
    store = await startObjectStore({ port: 0, directory });
    client = new S3Client({
      endpoint: store.endpoint,
      region: store.region,
      forcePathStyle: true,
      credentials: store.credentials,
    });
  });

  afterAll(async () => {
    client?.destroy();
    await store?.stop();
    await rm(directory, { recursive: true, force: true });
  });

  it('listens on loopback and creates the gapwise bucket', async () => {
    expect(store.endpoint).toMatch(/^http:\/\/127\.0\.0\.1:\d+$/);
    const buckets = await client.send(new ListBucketsCommand({}));
    expect(buckets.Buckets?.map((b) => b.Name)).toEqual(['gapwise']);
  });

  it('stores an object and gives back the same bytes', async () => {
    const body = 'donor,acceptor,distance_angstrom\nZn-porphyrin,C60,12.5\n';
    await client.send(
      new PutObjectCommand({
        Bucket: 'gapwise',
        Key: 'uploads/pairs.csv',
        Body: body,
        ContentType: 'text/csv',
      }),
    );
    const got = await client.send(
      new GetObjectCommand({ Bucket: 'gapwise', Key: 'uploads/pairs.csv' }),
    );
    expect(got.ContentType).toBe('text/csv');
    expect(await got.Body?.transformToString()).toBe(body);
  });

  it('answers NoSuchKey for a missing object', async () => {
    await expect(
      client.send(new GetObjectCommand({ Bucket: 'gapwise', Key: 'missing' })),
    ).rejects.toMatchObject({
      name: 'NoSuchKey',
    });
  });

  it('keeps objects across a restart on the same folder', async () => {
    await store.stop();
    store = await startObjectStore({ port: 0, directory });
    client.destroy();
    client = new S3Client({
      endpoint: store.endpoint,
      region: store.region,
      forcePathStyle: true,
      credentials: store.credentials,
    });
    const got = await client.send(
      new GetObjectCommand({ Bucket: 'gapwise', Key: 'uploads/pairs.csv' }),
    );
    expect(await got.Body?.transformToString()).toContain('Zn-porphyrin');
  });
});
