import { randomBytes } from 'node:crypto';
import { Session, type User } from '@/db/models';
import { SESSION_COOKIE_BASE } from '@/lib/auth/cookies';

/** A signed-in test user's session: its token, the Cookie header, and helpers for browsers and clean-up. */
export type TestSession = {
  token: string;
  /** `name=token`, for a supertest Cookie header. */
  cookie: string;
  /** The cookie for a browser context's `addCookies`, on `baseUrl`. */
  browserCookie: (baseUrl: string) => { name: string; value: string; url: string; httpOnly: true; sameSite: 'Lax' };
  /** Deletes the session row (signs the user out). */
  revoke: () => Promise<number>;
};

/**
 * A real database session for `user`, as Auth.js stores it, and the Cookie
 * header that carries it (plain cookie name: the tests' AUTH_URL is http).
 * `ttlMs` is how long it lasts (an hour unless given).
 */
export async function openSession(user: User, { cookieName = SESSION_COOKIE_BASE, ttlMs = 3_600_000 } = {}): Promise<TestSession> {
  const token = randomBytes(24).toString('base64url');
  await Session.create({ sessionToken: token, userId: user.id, expires: new Date(Date.now() + ttlMs) });
  return {
    token,
    cookie: `${cookieName}=${token}`,
    browserCookie: (baseUrl) => ({ name: cookieName, value: token, url: baseUrl, httpOnly: true, sameSite: 'Lax' }),
    revoke: () => Session.destroy({ where: { sessionToken: token } }),
  };
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
