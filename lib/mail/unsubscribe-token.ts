import { createHmac, timingSafeEqual } from 'node:crypto';

/**
 * Opaque, hard-to-forge unsubscribe tokens (RFC 8058 §3: "The URI SHOULD
 * contain an opaque, hard-to-forge token identifying both the recipient and
 * the list"). A token is `<scope><id>.<mac>`:
 *
 * - scope `s`: one subscription (id = subscriptions.id);
 * - scope `d`: a weekly digest mail (id = its outbox row), which stands for
 *   every digest-mode subscription of the address it was sent to;
 * - mac: HMAC-SHA256 with AUTH_SECRET over the scope, the id and the
 *   recipient's address (lower-cased), base64url (43 characters).
 *
 * Nothing is stored: the server recomputes the MAC from the row and compares
 * in constant time. The address is not in the token, only bound by the MAC.
 */

export type UnsubscribeScope = 's' | 'd';
/** What a token points at: a subscription (`s`) or a digest mail (`d`), by id. */
export type UnsubscribeTarget = { scope: UnsubscribeScope; id: number };

const TOKEN = /^([sd])([1-9][0-9]{0,17})\.([A-Za-z0-9_-]{43})$/;

function mac(secret: string, scope: UnsubscribeScope, id: number, email: string): Buffer {
  if (!secret) throw new Error('AUTH_SECRET is not set: unsubscribe links cannot be signed.');
  return createHmac('sha256', secret).update(`trialbed-unsubscribe\n${scope}\n${id}\n${email.trim().toLowerCase()}`).digest();
}

/** Makes the token for one subscription (`s`) or one digest mail (`d`) sent to `email`. Throws when the secret is empty. */
export function createUnsubscribeToken(secret: string, target: UnsubscribeTarget & { email: string }): string {
  return `${target.scope}${target.id}.${mac(secret, target.scope, target.id, target.email).toString('base64url')}`;
}

/** Reads what a token points at, without checking it (null when it is not even shaped like one). */
export function parseUnsubscribeToken(token: string): (UnsubscribeTarget & { mac: string }) | null {
  const m = TOKEN.exec(token);
  if (!m) return null;
  const id = Number(m[2]);
  if (!Number.isSafeInteger(id)) return null;
  return { scope: m[1] as UnsubscribeScope, id, mac: m[3] };
}

/** True when `token` was made by this server for `target` sent to `email` (constant-time comparison). */
export function isValidUnsubscribeToken(secret: string, token: string, target: UnsubscribeTarget & { email: string }): boolean {
  const parsed = parseUnsubscribeToken(token);
  if (!parsed || parsed.scope !== target.scope || parsed.id !== target.id) return false;
  // Compare the encoded text, not decoded bytes: base64url's last character has spare bits, so
  // decoding would accept several spellings of one MAC.
  const given = Buffer.from(parsed.mac, 'ascii');
  const expected = Buffer.from(mac(secret, target.scope, target.id, target.email).toString('base64url'), 'ascii');
  return given.length === expected.length && timingSafeEqual(given, expected);
}

/**
 * The RFC 2369 / RFC 8058 headers of an update mail: `List-Unsubscribe` with
 * the HTTPS URI in angle brackets, and `List-Unsubscribe-Post` with the single
 * pair `List-Unsubscribe=One-Click`. `baseUrl` is the public address
 * (AUTH_URL); a real site serves it over https.
 */
export function listUnsubscribeHeaders(baseUrl: string, token: string): { 'List-Unsubscribe': string; 'List-Unsubscribe-Post': string; url: string } {
  const url = unsubscribeUrl(baseUrl, token);
  return { 'List-Unsubscribe': `<${url}>`, 'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click', url };
}

/** The one-click unsubscribe URL of a token (the route handler app/api/unsubscribe). */
export function unsubscribeUrl(baseUrl: string, token: string): string {
  return `${baseUrl.replace(/\/$/, '')}/api/unsubscribe?token=${encodeURIComponent(token)}`;
}
