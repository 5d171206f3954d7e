import { mkdtemp, readFile, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import nodemailer from 'nodemailer';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startMailCapture, type MailCapture } from './mail-capture-server.ts';

describe('mail capture service', () => {
  let capture: MailCapture;
  let directory: string;

  beforeAll(async () => {
    directory = await mkdtemp(join(tmpdir(), 'gapwise-mail-'));
    capture = await startMailCapture({ smtpPort: 0, httpPort: 0, directory });
  });

  afterAll(async () => {
    await capture?.stop();
    await rm(directory, { recursive: true, force: true });
  });

  const transport = () =>
    nodemailer.createTransport({
      host: '127.0.0.1',
      port: capture.smtpPort,
      secure: false,
      ignoreTLS: true,
    });

  it('receives a message sent through nodemailer with its recipient, subject and body', async () => {
    const link = 'http://127.0.0.1:4280/reset?token=abc123';
    await transport().sendMail({
      from: 'Gapwise <no-reply@gapwise.test>',
      to: 'Editor <editor@gapwise.test>',
      subject: 'Reset your Gapwise password',
      text: `Open ${link} to choose a new password.`,
    });

    const message = await capture.waitFor(
      (m) => m.envelopeTo.includes('editor@gapwise.test'),
      5_000,
    );
    expect(message.subject).toBe('Reset your Gapwise password');
    expect(message.to).toEqual(['editor@gapwise.test']);
    expect(message.from).toBe('no-reply@gapwise.test');
    expect(message.text).toContain(link);

    const files = await readdir(directory);
    expect(files).toContain(`${message.id}.eml`);
    expect(await readFile(join(directory, `${message.id}.eml`), 'utf8')).toContain(
      'Subject: Reset your Gapwise password',
    );
  });

  it('waits for a message that has not arrived yet', async () => {
    const waiting = capture.waitFor((m) => m.subject === 'later', 5_000);
    await transport().sendMail({
      from: 'a@gapwise.test',
      to: 'b@gapwise.test',
      subject: 'later',
      text: 'x',
    });
    await expect(waiting).resolves.toMatchObject({
      subject: 'later',
      envelopeTo: ['b@gapwise.test'],
    });
  });

  it('rejects waitFor after the timeout, naming what did arrive', async () => {
    await expect(capture.waitFor((m) => m.subject === 'never sent', 200)).rejects.toThrow(
      /no matching e-mail within 200 ms; received \d+: .*Reset your Gapwise password/,
    );
  });

  it('lists messages over loopback HTTP and clears them', async () => {
    const base = `http://127.0.0.1:${capture.httpPort}`;
    const listed = (await (await fetch(`${base}/messages`)).json()) as {
      subject: string;
      id: string;
    }[];
    expect(listed.map((m) => m.subject)).toEqual(['Reset your Gapwise password', 'later']);

    const one = await fetch(`${base}/messages/${encodeURIComponent(listed[0]!.id)}`);
    expect(one.status).toBe(200);
    expect(((await one.json()) as { subject: string }).subject).toBe('Reset your Gapwise password');
    expect((await fetch(`${base}/messages/nope`)).status).toBe(404);

    expect((await fetch(`${base}/messages`, { method: 'DELETE' })).status).toBe(200);
    expect(capture.messages()).toEqual([]);
  });
});
