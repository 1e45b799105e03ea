import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import { getEnv } from '@/lib/env';

let transport: Transporter | null = null;

/**
 * The SMTP transport, from SMTP_HOST/PORT/USER/PASSWORD/SECURE: the local
 * capture server by default, a hosted provider when those are set. Built once.
 */
export function getMailTransport(): Transporter {
  transport ??= createMailTransport();
  return transport;
}

/**
 * A new SMTP transport from SMTP_*; with `pool`, it keeps a few connections
 * open between messages (the outbox worker sends many in a row, and a new
 * connection per message costs more than the message).
 */
export function createMailTransport({ pool = false }: { pool?: boolean } = {}): Transporter {
  const env = getEnv();
  return nodemailer.createTransport({
    ...(pool ? { pool: true, maxConnections: 4, maxMessages: 100 } : {}),
    host: env.SMTP_HOST,
    port: env.SMTP_PORT,
    secure: env.SMTP_SECURE === '1',
    auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD } : undefined,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    // A stalled server must not hold a worker's claim for long (lib/mail/outbox-worker.ts locks rows for 5 minutes).
    socketTimeout: 60_000,
  });
}

/**
 * Sends one message; throws when the server refuses any recipient, so the
 * caller can tell the person it did not go out.
 */
export async function sendMail(message: { to: string; subject: string; text: string; html?: string }): Promise<void> {
  const env = getEnv();
  const result = await getMailTransport().sendMail({ from: env.MAIL_FROM, ...message });
  const failed = [...(result.rejected ?? []), ...(result.pending ?? [])].filter(Boolean);
  if (failed.length) throw new Error(`The mail server refused ${failed.length} recipient(s).`);
}
