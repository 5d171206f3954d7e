/**
 * A local SMTP capture service for development and tests: accepts every message on 127.0.0.1,
 * keeps it in memory (and, when asked, as files), and lists it over a loopback HTTP endpoint.
 * Nothing is ever relayed.
 */
import { mkdir, writeFile } from 'node:fs/promises';
import { createServer, type Server } from 'node:http';
import type { EventEmitter } from 'node:events';
import type { AddressInfo, Server as NetServer } from 'node:net';
import { join } from 'node:path';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer, type SMTPServerSession } from 'smtp-server';

/** One captured message, as listed by `messages()` and `GET /messages`. */
export interface CapturedMessage {
  readonly id: string;
  readonly receivedAt: string;
  /** SMTP envelope sender (MAIL FROM). */
  readonly envelopeFrom: string | null;
  /** SMTP envelope recipients (RCPT TO), lower-cased. */
  readonly envelopeTo: readonly string[];
  readonly from: string | null;
  /** Header recipients (To, Cc), lower-cased. */
  readonly to: readonly string[];
  readonly subject: string;
  readonly text: string;
  readonly html: string | null;
  readonly headers: Readonly<Record<string, string>>;
}

export interface MailCaptureOptions {
  /** SMTP port on 127.0.0.1; 0 picks a free one. */
  readonly smtpPort: number;
  /** HTTP listing port on 127.0.0.1; 0 picks a free one; omit for no HTTP listing. */
  readonly httpPort?: number;
  /** When set, every message is also written there as `<id>.eml` and `<id>.json`. */
  readonly directory?: string;
}

export interface MailCapture {
  readonly smtpPort: number;
  readonly httpPort: number | null;
  /** Every message received so far, oldest first. */
  messages(): readonly CapturedMessage[];
  /** Resolves with the first message (already received or still to come) that matches. */
  waitFor(
    predicate: (message: CapturedMessage) => boolean,
    timeoutMs?: number,
  ): Promise<CapturedMessage>;
  /** Forgets the messages held in memory (files stay). */
  clear(): void;
  stop(): Promise<void>;
}

const loopback = '127.0.0.1';

function addresses(value: AddressObject | AddressObject[] | undefined): string[] {
  const list = value === undefined ? [] : Array.isArray(value) ? value : [value];
  return list.flatMap((group) => group.value.map((entry) => (entry.address ?? '').toLowerCase()));
}

/**
 * Starts a server on 127.0.0.1 and resolves with the port it got (rejects on EADDRINUSE).
 * `start` calls the server's own listen(port, host, ready); `bound` is the underlying net server.
 */
function listen(
  server: EventEmitter,
  start: (ready: () => void) => void,
  bound: () => NetServer,
): Promise<number> {
  return new Promise((resolve, reject) => {
    const onError = (error: Error) => reject(error);
    server.once('error', onError);
    start(() => {
      server.removeListener('error', onError);
      resolve((bound().address() as AddressInfo).port);
    });
  });
}

export async function startMailCapture(options: MailCaptureOptions): Promise<MailCapture> {
  const received: CapturedMessage[] = [];
  const waiters = new Set<(message: CapturedMessage) => void>();
  let counter = 0;
  if (options.directory !== undefined) {
    await mkdir(options.directory, { recursive: true });
  }

  async function store(raw: Buffer, session: SMTPServerSession): Promise<void> {
    const parsed = await simpleParser(raw);
    counter += 1;
    const id = `${Date.now()}-${String(counter).padStart(4, '0')}`;
    const headers: Record<string, string> = {};
    for (const line of parsed.headerLines) {
      headers[line.key] = line.line.slice(line.line.indexOf(':') + 1).trim();
    }
    const message: CapturedMessage = {
      id,
      receivedAt: new Date().toISOString(),
      envelopeFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
      envelopeTo: session.envelope.rcptTo.map((rcpt) => rcpt.address.toLowerCase()),
      from: parsed.from?.value[0]?.address ?? null,
      to: [...addresses(parsed.to), ...addresses(parsed.cc)],
      subject: parsed.subject ?? '',
      text: parsed.text ?? '',
      html: typeof parsed.html === 'string' ? parsed.html : null,
      headers,
    };
    if (options.directory !== undefined) {
      await writeFile(join(options.directory, `${id}.eml`), raw);
      await writeFile(join(options.directory, `${id}.json`), JSON.stringify(message, null, 2));
    }
    received.push(message);
    for (const notify of [...waiters]) notify(message);
  }

  const smtp = new SMTPServer({
    secure: false,
    disabledCommands: ['STARTTLS'],
    authOptional: true,
    logger: false,
    size: 25 * 1024 * 1024,
    onAuth(_auth, _session, callback) {
      callback(null, { user: 'capture' });
    },
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('error', (error) => callback(error));
      stream.on('end', () => {
        const raw = Buffer.concat(chunks);
        store(raw, session)
          .then(() => callback())
          .catch((error: unknown) =>
            callback(error instanceof Error ? error : new Error(String(error))),
          );
      });
    },
  });

  const smtpPort = await listen(
    smtp,
    (ready) => smtp.listen(options.smtpPort, loopback, ready),
    () => smtp.server,
  );

  let http: Server | null = null;
  let httpPort: number | null = null;
  if (options.httpPort !== undefined) {
    http = createServer((request, response) => {
      const url = new URL(request.url ?? '/', `http://${loopback}`);
      const send = (status: number, body: unknown) => {
        response.writeHead(status, { 'content-type': 'application/json; charset=utf-8' });
        response.end(JSON.stringify(body));
      };
      if (url.pathname === '/messages' && request.method === 'GET') {
        send(200, received);
      } else if (url.pathname === '/messages' && request.method === 'DELETE') {
        received.length = 0;
        send(200, { cleared: true });
      } else if (url.pathname.startsWith('/messages/') && request.method === 'GET') {
        const found = received.find((m) => m.id === decodeURIComponent(url.pathname.slice(10)));
        if (found) send(200, found);
        else send(404, { code: 'message-not-found' });
      } else {
        send(404, { code: 'not-found' });
      }
    });
    const server = http;
    const port = options.httpPort;
    httpPort = await listen(
      server,
      (ready) => server.listen(port, loopback, ready),
      () => server,
    );
  }

  return {
    smtpPort,
    httpPort,
    messages: () => [...received],
    clear: () => {
      received.length = 0;
    },
    waitFor(predicate, timeoutMs = 30_000) {
      const already = received.find(predicate);
      if (already) return Promise.resolve(already);
      return new Promise((resolve, reject) => {
        const timer = setTimeout(() => {
          waiters.delete(check);
          const seen = received.map((m) => `"${m.subject}" to ${m.envelopeTo.join(', ')}`);
          reject(
            new Error(
              `no matching e-mail within ${timeoutMs} ms; received ${received.length}: ${seen.join('; ') || 'none'}`,
            ),
          );
        }, timeoutMs);
        const check = (message: CapturedMessage) => {
          if (!predicate(message)) return;
          clearTimeout(timer);
          waiters.delete(check);
          resolve(message);
        };
        waiters.add(check);
      });
    },
    async stop() {
      await new Promise<void>((resolve) => smtp.close(() => resolve()));
      if (http) {
        const server = http;
        await new Promise<void>((resolve) => {
          server.close(() => resolve());
          server.closeAllConnections();
        });
      }
    },
  };
}
