/**
 * `npm run services:start`: after postgres-start.sh has started the dev cluster, runs the mail
 * capture and the S3-compatible store in this one process until Ctrl-C. Same ports and
 * environment variables as mail/mail-capture.ts and s3/object-store-service.ts.
 */
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { startMailCapture } from './mail/mail-capture-server.ts';
import { startObjectStore } from './s3/object-store.ts';

const root = fileURLToPath(new URL('..', import.meta.url));
const dataDir = resolve(process.env['GAPWISE_DATA_DIR'] ?? join(root, '.data'));

function port(name: string, fallback: number): number {
  const value = Number(process.env[name] ?? fallback);
  if (!Number.isInteger(value) || value < 0 || value > 65535) {
    throw new Error(`${name} must be a port number, got '${process.env[name]}'`);
  }
  return value;
}

const mail = await startMailCapture({
  smtpPort: port('SMTP_PORT', 2525),
  httpPort: port('MAIL_UI_PORT', 2526),
  directory: join(dataDir, 'mail'),
});
const store = await startObjectStore({
  port: port('S3_PORT', 4568),
  directory: join(dataDir, 's3'),
  bucket: process.env['S3_BUCKET'] ?? 'gapwise',
});

console.log(`[mail] SMTP capture on smtp://127.0.0.1:${mail.smtpPort} (nothing is relayed)`);
console.log(`[mail] messages at http://127.0.0.1:${mail.httpPort}/messages`);
console.log(`[s3]   S3-compatible store on ${store.endpoint}, bucket "${store.bucket}"`);
console.log('Ctrl-C stops mail and S3; PostgreSQL keeps running (npm run db:stop).');

const shutdown = () => {
  Promise.all([mail.stop(), store.stop()]).then(
    () => process.exit(0),
    () => process.exit(1),
  );
};
process.once('SIGINT', shutdown);
process.once('SIGTERM', shutdown);
