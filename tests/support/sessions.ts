import { randomBytes } from 'node:crypto';
import { Session, type User } from '@/db/models';
import { SESSION_COOKIE_BASE } from '@/lib/auth/cookies';

/**
 * A real database session for `user`, as Auth.js stores it, and the Cookie
 * header that carries it (plain cookie name: the tests' AUTH_URL is http).
 */
export async function openSession(user: User, { cookieName = SESSION_COOKIE_BASE } = {}): Promise<{ token: string; cookie: string }> {
  const token = randomBytes(24).toString('base64url');
  await Session.create({ sessionToken: token, userId: user.id, expires: new Date(Date.now() + 3_600_000) });
  return { token, cookie: `${cookieName}=${token}` };
}

/** Parses Set-Cookie headers into name → { value, attributes (lower-case keys) }. */
export function parseSetCookies(setCookie: string[] | string | undefined): Map<string, { value: string; attrs: Record<string, string | true> }> {
  const out = new Map<string, { value: string; attrs: Record<string, string | true> }>();
  for (const line of Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : []) {
    const [pair, ...rest] = line.split(';').map((s) => s.trim());
    const eq = pair.indexOf('=');
    const attrs: Record<string, string | true> = {};
    for (const a of rest) {
      const i = a.indexOf('=');
      if (i < 0) attrs[a.toLowerCase()] = true;
      else attrs[a.slice(0, i).toLowerCase()] = a.slice(i + 1);
    }
    out.set(pair.slice(0, eq), { value: pair.slice(eq + 1), attrs });
  }
  return out;
}
