import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { readTrace, TraceTooLargeError } from './trace-stream';

const settings = { unit: 'eV' } as Parameters<typeof readTrace>[1];
async function* once(bytes: Buffer) {
  yield bytes;
}

describe('readTrace decompression caps', () => {
  const text = `frame,dE\n${'1,0.1\n'.repeat(200_000)}`; // 1.2 MB inflated

  it('stops a gzip file past maxDecompressedBytes with TraceTooLargeError naming the cap', async () => {
    const error = await readTrace(once(gzipSync(text)), settings, () => undefined, {
      maxDecompressedBytes: 100_000,
    }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(TraceTooLargeError);
    expect((error as TraceTooLargeError).limitBytes).toBe(100_000);
    expect((error as TraceTooLargeError).ratio).toBeNull();
  });

  it('reads the same file under a cap it fits in', async () => {
    const read = await readTrace(once(gzipSync(text)), settings, () => undefined, {
      maxDecompressedBytes: 2_000_000,
      maxGzipRatio: 100,
    });
    expect(read.gzip).toBe(true);
  });
});
