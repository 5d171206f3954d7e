/**
 * Development entry: `npm run mail:start` (or `npx tsx docker-free-scripts/mail/mail-capture.ts`).
 * SMTP on 127.0.0.1:$SMTP_PORT (2525), listing on http://127.0.0.1:$MAIL_UI_PORT/messages (2526),
 * copies of every message in $GAPWISE_DATA_DIR/mail (.data/mail). Ctrl-C stops it.
 */
import { fileURLToPath } from 'node:url';
import { join, resolve } from 'node:path';
import { startMailCapture } from './mail-capture-server.ts';

const root = fileURLToPath(new URL('../..', import.meta.url));
const dataDir = resolve(process.env['GAPWISE_DATA_DIR'] ?? join(root, '.data'));

function port(name: string, fallback: number): number {
  const value = Number(process.env[name] ?? fallback);
  if (!Number.isInteger(value) || value < 0 || value > 65535) {
    throw new Error(`${name} must be a port number, got '${process.env[name]}'`);
  }
  return value;
}

const capture = await startMailCapture({
  smtpPort: port('SMTP_PORT', 2525),
  httpPort: port('MAIL_UI_PORT', 2526),
  directory: join(dataDir, 'mail'),
});
console.log(`[mail] SMTP capture on smtp://127.0.0.1:${capture.smtpPort} (nothing is relayed)`);
console.log(
  `[mail] messages at http://127.0.0.1:${capture.httpPort}/messages and in ${join(dataDir, 'mail')}`,
);

const shutdown = () => {
  capture.stop().then(
    () => process.exit(0),
    () => process.exit(1),
  );
};
process.once('SIGINT', shutdown);
process.once('SIGTERM', shutdown);
