import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import nodemailer from 'nodemailer';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startCaptureServer, type CaptureServer } from '@/lib/mail/capture-server';
import { firstLink, getCapturedMail, listCapturedMail } from '@/lib/mail/mailbox';

// The capture SMTP server: real SMTP from nodemailer on a free loopback port,
// decoded by mailparser, stored as files other processes can read.
describe('capture SMTP server', () => {
  let dir: string;
  let server: CaptureServer;
  beforeAll(async () => {
    dir = mkdtempSync(path.join(os.tmpdir(), 'trialbed-capture-'));
    server = await startCaptureServer({ port: 0, dir });
  });
  afterAll(async () => {
    await server.close();
    rmSync(dir, { recursive: true, force: true });
  });

  it('stores a message with its quoted-printable text decoded', async () => {
    // A long line with "=" and "&" is exactly what quoted-printable folds and escapes.
    const url = `http://localhost:3000/api/auth/callback/nodemailer?callbackUrl=${encodeURIComponent('http://localhost:3000/account')}&token=${'ab12'.repeat(16)}&email=reader%40example.test`;
    const transport = nodemailer.createTransport({ host: '127.0.0.1', port: server.port, secure: false });
    const arrived = server.nextMail('reader@example.test');
    await transport.sendMail({ from: 'Trialbed <no-reply@trialbed.invalid>', to: 'reader@example.test', subject: 'Your Trialbed sign-in link', text: `Open this link:\n\n${url}\n`, html: `<a href="${url}">Sign in</a>` });
    const mail = await arrived;
    expect(mail.to).toEqual(['reader@example.test']);
    expect(mail.subject).toBe('Your Trialbed sign-in link');
    expect(firstLink(mail.text)).toBe(url);
    expect(mail.html).toContain('Sign in');
    expect(listCapturedMail(dir, { to: 'READER@example.test' })[0].id).toBe(mail.id);
    expect(getCapturedMail(dir, mail.id)?.text).toBe(mail.text);
  });

  it('reads nothing outside the mailbox folder', () => {
    expect(getCapturedMail(dir, '../../etc/passwd')).toBeNull();
    expect(listCapturedMail(path.join(dir, 'missing'))).toEqual([]);
  });
});
