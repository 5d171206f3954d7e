/**
 * Development entry: `npm run s3:start` (or `npx tsx docker-free-scripts/s3/object-store-service.ts`).
 * S3 API on http://127.0.0.1:$S3_PORT (4568), bucket $S3_BUCKET (gapwise), objects in
 * $GAPWISE_DATA_DIR/s3 (.data/s3). Ctrl-C stops it.
 */
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { startObjectStore } from './object-store.ts';

const root = fileURLToPath(new URL('../..', import.meta.url));
const dataDir = resolve(process.env['GAPWISE_DATA_DIR'] ?? join(root, '.data'));
const port = Number(process.env['S3_PORT'] ?? 4568);
if (!Number.isInteger(port) || port < 0 || port > 65535) {
  throw new Error(`S3_PORT must be a port number, got '${process.env['S3_PORT']}'`);
}

const store = await startObjectStore({
  port,
  directory: join(dataDir, 's3'),
  bucket: process.env['S3_BUCKET'] ?? 'gapwise',
});
console.log(
  `[s3] S3-compatible store on ${store.endpoint}, bucket "${store.bucket}", data in ${join(dataDir, 's3')}`,
);
console.log(
  '[s3] client settings: region us-east-1, forcePathStyle true, credentials S3RVER/S3RVER',
);

const shutdown = () => {
  store.stop().then(
    () => process.exit(0),
    () => process.exit(1),
  );
};
process.once('SIGINT', shutdown);
process.once('SIGTERM', shutdown);
