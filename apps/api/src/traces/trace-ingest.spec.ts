import { createHash } from 'node:crypto';
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { ListObjectsV2Command } from '@aws-sdk/client-s3';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import {
  startObjectStore,
  type ObjectStore,
} from '../../../../docker-free-scripts/s3/object-store';
import { TraceRefusedError, ingestTrace } from './trace-ingest';
import { TraceObjectStore } from './trace-object-store';

async function* chunked(bytes: Buffer, size = 64 * 1024) {
  for (let i = 0; i < bytes.length; i += size) yield bytes.subarray(i, i + size);
}

/** A seeded, repeatable text trace of `n` rows (a linear congruential generator). */
function traceText(n: number, seed = 1): string {
  let state = seed;
  const rows = ['frame,dE_eV'];
  for (let i = 0; i < n; i++) {
    state = (state * 1103515245 + 12345) % 2147483648;
    rows.push(`${i},${(0.5 + state / 2147483648).toFixed(6)}`);
  }
  return rows.join('\n') + '\n';
}

describe('trace ingest into object storage', () => {
  let directory: string;
  let server: ObjectStore;
  let store: TraceObjectStore;

  const listKeys = async () => {
    const listed = await store.client.send(new ListObjectsV2Command({ Bucket: store.bucket }));
    return (listed.Contents ?? []).map((o) => o.Key ?? '');
  };

  beforeAll(async () => {
    directory = await mkdtemp(join(tmpdir(), 'gapwise-trace-s3-'));
    server = await startObjectStore({ port: 0, directory });
    store = new TraceObjectStore({
      endpoint: server.endpoint,
      region: server.region,
      bucket: server.bucket,
      accessKeyId: server.credentials.accessKeyId,
      secretAccessKey: server.credentials.secretAccessKey,
    });
  });

  afterAll(async () => {
    store?.destroy();
    await server?.stop();
    await rm(directory, { recursive: true, force: true });
  });

  beforeEach(async () => {
    for (const key of await listKeys()) await store.delete(key);
  });

  it('stores an accepted file under its SHA-256 and gives back the same bytes', async () => {
    const bytes = Buffer.from(traceText(1000));
    const expected = createHash('sha256').update(bytes).digest('hex');
    const got = await ingestTrace(store, chunked(bytes, 1000), { unit: 'eV' });
    expect(got.sha256).toBe(expected);
    expect(got.objectKey).toBe(`traces/sha256/${expected}`);
    expect(got.sizeBytes).toBe(bytes.length);
    expect(got.summary.sampleCount).toBe(1000);
    expect(await listKeys()).toEqual([`traces/sha256/${expected}`]);
    const back = Buffer.concat(await (await store.open(got.objectKey)).toArray());
    expect(back.equals(bytes)).toBe(true);
  });

  it('keeps one object when the same content is uploaded twice', async () => {
    const bytes = Buffer.from(traceText(50));
    const a = await ingestTrace(store, chunked(bytes), { unit: 'eV' });
    const b = await ingestTrace(store, chunked(bytes), { unit: 'eV' });
    expect(b.objectKey).toBe(a.objectKey);
    expect(await listKeys()).toHaveLength(1);
  });

  it('hashes and stores a gzip file as uploaded (compressed)', async () => {
    const gz = gzipSync(Buffer.from(traceText(2000)));
    const got = await ingestTrace(store, chunked(gz, 333), { unit: 'eV' });
    expect(got.gzip).toBe(true);
    expect(got.sha256).toBe(createHash('sha256').update(gz).digest('hex'));
    expect(got.summary.sampleCount).toBe(2000);
  });

  it.each([
    ['non-numeric', 'dE\n1\nabc\n', "Line 3: 'abc' is not a number."],
    ['empty', 'a,dE\n1,2\n2,\n', 'Line 3: empty value in column 2.'],
    ['non-finite', 'dE\n1\n1e400\n', 'Line 3: non-finite value.'],
    ['header only', 'frame,dE\n', 'No data rows found.'],
  ])('refuses a %s file and stores nothing', async (_kind, text, message) => {
    const error = await ingestTrace(store, chunked(Buffer.from(text)), { unit: 'eV' }).catch(
      (e) => e,
    );
    expect(error).toBeInstanceOf(TraceRefusedError);
    expect((error as TraceRefusedError).problems[0].message).toBe(message);
    expect(await listKeys()).toEqual([]);
  });

  it('refuses a large multipart file whose last line is bad, leaving no object', async () => {
    const text = traceText(800_000) + '800000,oops\n'; // ≈ 14 MB: two 8 MB parts
    const error = await ingestTrace(store, chunked(Buffer.from(text), 1 << 20), {
      unit: 'eV',
    }).catch((e) => e);
    expect(error).toBeInstanceOf(TraceRefusedError);
    expect((error as TraceRefusedError).problems[0]).toMatchObject({ line: 800_002 });
    expect(await listKeys()).toEqual([]);
  });

  it('leaves no object when the upload breaks off half way', async () => {
    const bytes = Buffer.from(traceText(800_000));
    async function* brokenOff() {
      let sent = 0;
      for await (const chunk of chunked(bytes, 1 << 20)) {
        yield chunk;
        sent += chunk.length;
        if (sent > 10 << 20) throw new Error('client went away');
      }
    }
    await expect(ingestTrace(store, brokenOff(), { unit: 'eV' })).rejects.toThrow(
      'client went away',
    );
    expect(await listKeys()).toEqual([]);
    // No completed object either in the store's own folder for the bucket's content.
    const files = await readdir(join(directory, 'gapwise'), { recursive: true });
    expect(files.filter((f) => String(f).endsWith('._S3rver_object'))).toEqual([]);
  });
});
