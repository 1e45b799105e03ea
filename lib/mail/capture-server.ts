/**
 * A capture SMTP server for local use and tests: accepts every message on
 * 127.0.0.1, decodes it with mailparser and stores it in the mailbox folder
 * (lib/mail/mailbox.ts). Nothing is relayed anywhere.
 *
 * `npm start` runs it as its own process:
 *   node --conditions=react-server --import tsx lib/mail/capture-server.ts
 * listening on SMTP_PORT (default 2525) and writing to DATA_DIR/mailbox.
 * Tests call startCaptureServer() on a free port instead.
 */
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { MAILBOX_KEEP, mailboxDir, saveCapturedMail, type CapturedMail } from './mailbox';

export type CaptureServer = {
  port: number;
  dir: string;
  /** Resolves with the next message to `to` (or any message) stored after this call. */
  nextMail: (to?: string, timeoutMs?: number) => Promise<CapturedMail>;
  close: () => Promise<void>;
};

const addresses = (a: AddressObject | AddressObject[] | undefined): string[] =>
  (Array.isArray(a) ? a : a ? [a] : []).flatMap((o) => o.value.map((v) => v.address ?? '').filter(Boolean));

/** Starts the capture server on 127.0.0.1:`port` (0 picks a free one), storing into `dir` and keeping the newest `keep` messages. */
export async function startCaptureServer({ port = 0, dir = mailboxDir(), keep = MAILBOX_KEEP }: { port?: number; dir?: string; keep?: number } = {}): Promise<CaptureServer> {
  const waiters: { to?: string; resolve: (m: CapturedMail) => void }[] = [];
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    banner: 'Trialbed capture server (nothing is delivered)',
    size: 5 * 1024 * 1024,
    logger: false,
    closeTimeout: 1_000,
    // Loopback only: a reverse DNS lookup of 127.0.0.1 would only slow every message down.
    disableReverseLookup: true,
    onAuth(_auth, _session, callback) {
      // Any credentials are fine: a hosted provider's settings can be tried against the capture server.
      callback(null, { user: 'capture' });
    },
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const envelopeTo = session.envelope.rcptTo.map((r) => r.address);
          const mail = saveCapturedMail(dir, {
            receivedAt: new Date().toISOString(),
            from: parsed.from?.text ?? (session.envelope.mailFrom ? session.envelope.mailFrom.address : ''),
            to: envelopeTo.length ? envelopeTo : addresses(parsed.to),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : null,
            messageId: parsed.messageId ?? null,
            headerLines: (parsed.headerLines ?? []).map((h) => ({
              key: h.key.toLowerCase(),
              // The raw line, unfolded: a CRLF before whitespace is removed (RFC 5322 §2.2.3).
              value: h.line.replace(/\r?\n(?=[ \t])/g, '').replace(/^[^:]*:[ \t]*/, ''),
            })),
          }, keep);
          for (const w of [...waiters]) {
            if (!w.to || mail.to.some((t) => t.toLowerCase() === w.to!.toLowerCase())) {
              waiters.splice(waiters.indexOf(w), 1);
              w.resolve(mail);
            }
          }
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  const address = server.server.address();
  const actualPort = typeof address === 'object' && address ? address.port : port;
  return {
    port: actualPort,
    dir,
    nextMail: (to, timeoutMs = 15_000) =>
      new Promise<CapturedMail>((resolve, reject) => {
        const waiter = {
          to,
          resolve: (m: CapturedMail) => {
            clearTimeout(timer);
            resolve(m);
          },
        };
        const timer = setTimeout(() => {
          waiters.splice(waiters.indexOf(waiter), 1);
          reject(new Error(`no mail${to ? ` to ${to}` : ''} within ${timeoutMs} ms`));
        }, timeoutMs);
        waiters.push(waiter);
      }),
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

// Run as a program (npm start): listen on SMTP_PORT until SIGTERM/SIGINT.
const isMain = process.argv[1] && /capture-server\.[cm]?[jt]s$/.test(process.argv[1]);
if (isMain) {
  const port = Number(process.env.SMTP_PORT ?? 2525);
  startCaptureServer({ port })
    .then((s) => {
      console.log(`[trialbed] capture SMTP server on 127.0.0.1:${s.port}; mail is stored in ${s.dir}`);
      const stop = () => {
        s.close().then(() => process.exit(0));
        setTimeout(() => process.exit(0), 3_000).unref();
      };
      process.once('SIGTERM', stop);
      process.once('SIGINT', stop);
    })
    .catch((err: Error) => {
      console.error(`[trialbed] capture SMTP server could not start on 127.0.0.1:${port}: ${err.message}`);
      process.exit(1);
    });
}
