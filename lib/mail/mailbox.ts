import { randomBytes } from 'node:crypto';
import { mkdirSync, readFileSync, readdirSync, rmSync, writeFileSync, renameSync } from 'node:fs';
import path from 'node:path';

/**
 * The local capture mailbox: mail caught by lib/mail/capture-server.ts,
 * one JSON file per message under DATA_DIR/mailbox/, so the app process
 * (the /dev/mailbox page) and tests in other processes can read it.
 * Only ever used with the loopback capture server; a hosted SMTP provider
 * never writes here.
 */

/** One captured message, decoded (the text part is no longer quoted-printable). */
export type CapturedMail = {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  /** The Message-ID header as sent (`<…@…>`), null when there was none. */
  messageId?: string | null;
  /** Every header line in order, unfolded (RFC 5322 §2.2.3), with its name lower-cased. */
  headerLines?: { key: string; value: string }[];
};

/** The values of one header (name in any case), in the order they appear; [] when absent. */
export function headerValues(mail: CapturedMail, name: string): string[] {
  const key = name.toLowerCase();
  return (mail.headerLines ?? []).filter((h) => h.key === key).map((h) => h.value);
}

/** How many messages the mailbox keeps; older ones are removed as new ones arrive. */
export const MAILBOX_KEEP = 200;

/** The mailbox folder for a data directory (DATA_DIR, default `.data`). */
export function mailboxDir(dataDir = process.env.DATA_DIR ?? '.data'): string {
  return path.resolve(dataDir, 'mailbox');
}

/** Stores one message atomically (write, then rename) and prunes the oldest beyond `keep` (default MAILBOX_KEEP). */
export function saveCapturedMail(dir: string, mail: Omit<CapturedMail, 'id'>, keep = MAILBOX_KEEP): CapturedMail {
  mkdirSync(dir, { recursive: true });
  const id = `${Date.now().toString().padStart(14, '0')}-${randomBytes(4).toString('hex')}`;
  const stored: CapturedMail = { id, ...mail };
  const tmp = path.join(dir, `.${id}.tmp`);
  writeFileSync(tmp, JSON.stringify(stored));
  renameSync(tmp, path.join(dir, `${id}.json`));
  const files = messageFiles(dir);
  for (const f of files.slice(0, Math.max(0, files.length - keep))) rmSync(path.join(dir, f), { force: true });
  return stored;
}

function messageFiles(dir: string): string[] {
  try {
    return readdirSync(dir)
      .filter((f) => /^\d{14}-[0-9a-f]{8}\.json$/.test(f))
      .sort();
  } catch {
    return [];
  }
}

function readMail(dir: string, file: string): CapturedMail | null {
  try {
    return JSON.parse(readFileSync(path.join(dir, file), 'utf8')) as CapturedMail;
  } catch {
    return null;
  }
}

/** The newest captured messages first, optionally only those to one address. */
export function listCapturedMail(dir: string, { to, limit = 50 }: { to?: string; limit?: number } = {}): CapturedMail[] {
  const out: CapturedMail[] = [];
  const wanted = to?.toLowerCase();
  for (const f of messageFiles(dir).reverse()) {
    const m = readMail(dir, f);
    if (!m) continue;
    if (wanted && !m.to.some((t) => t.toLowerCase() === wanted)) continue;
    out.push(m);
    if (out.length >= limit) break;
  }
  return out;
}

/** One captured message by id, or null. Ids are checked, so no path can be smuggled in. */
export function getCapturedMail(dir: string, id: string): CapturedMail | null {
  if (!/^\d{14}-[0-9a-f]{8}$/.test(id)) return null;
  return readMail(dir, `${id}.json`);
}

/** The first http(s) link in a text, e.g. the sign-in link of a captured mail. */
export function firstLink(text: string): string | null {
  return text.match(/https?:\/\/[^\s<>"]+/)?.[0] ?? null;
}
