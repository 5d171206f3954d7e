/**
 * Small trace files for the API tests, written from seeded synthetic samples with known
 * parameters (libs/traces/src/synthetic-trace.ts), plus the helpers that upload them.
 */
import { createHash } from 'node:crypto';
import { gzipSync } from 'node:zlib';
import { ListObjectsV2Command, type S3Client } from '@aws-sdk/client-s3';
import type request from 'supertest';
import { syntheticGapSamples, type SyntheticTraceSpec } from '@gapwise/traces';
import type { Session } from '../support/test-app';

/** Text of a trace: header `frame,dE` and one row per sample, values divided by `evPerUnit`. */
export function traceCsv(
  spec: SyntheticTraceSpec,
  options: { evPerUnit?: number; eol?: string; digits?: number } = {},
): string {
  const eol = options.eol ?? '\n';
  const rows = ['frame,dE'];
  let i = 0;
  for (const ev of syntheticGapSamples(spec))
    rows.push(`${i++},${(ev / (options.evPerUnit ?? 1)).toFixed(options.digits ?? 9)}`);
  return rows.join(eol) + eol;
}

export const gzip = (text: string) => gzipSync(Buffer.from(text));
export const sha256 = (bytes: string | Buffer) => createHash('sha256').update(bytes).digest('hex');

export interface UploadFields {
  readonly state: 'reactant' | 'product';
  readonly unit: string;
  readonly column?: string;
  readonly skipBadLines?: boolean;
}

/** POSTs a multipart upload with the settings as fields before the file. */
export function uploadTrace(
  session: Session,
  workspaceId: string,
  body: string | Buffer,
  fields: UploadFields,
  fileName = 'trace.csv',
): request.Test {
  let req = session
    .call('post', `/api/workspaces/${workspaceId}/traces`)
    .field('state', fields.state)
    .field('unit', fields.unit);
  if (fields.column !== undefined) req = req.field('column', fields.column);
  if (fields.skipBadLines !== undefined)
    req = req.field('skipBadLines', String(fields.skipBadLines));
  return req.attach('file', typeof body === 'string' ? Buffer.from(body) : body, fileName);
}

export async function objectKeys(client: S3Client, bucket: string): Promise<string[]> {
  const listed = await client.send(new ListObjectsV2Command({ Bucket: bucket }));
  return (listed.Contents ?? []).map((o) => o.Key ?? '').sort();
}
