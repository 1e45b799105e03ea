import { randomBytes } from 'node:crypto';
import { Session, type User } from '@/db/models';

/** The cookie Auth.js reads a database session from (plain http; https uses the __Secure- name). */
export const SESSION_COOKIE = 'authjs.session-token';

/**
 * Signs a user in the way Auth.js with database sessions does: a `sessions`
 * row and its token. Send `cookie` as the Cookie header (supertest), or add
 * `browserCookie(url)` to a browser context.
 */
export async function createSessionFor(user: User, ttlMs = 24 * 60 * 60 * 1000) {
  const token = randomBytes(32).toString('hex');
  await Session.create({ sessionToken: token, userId: user.id, expires: new Date(Date.now() + ttlMs) });
  return {
    token,
    cookie: `${SESSION_COOKIE}=${token}`,
    browserCookie: (baseUrl: string) => ({ name: SESSION_COOKIE, value: token, url: baseUrl, httpOnly: true, sameSite: 'Lax' as const }),
    revoke: () => Session.destroy({ where: { sessionToken: token } }),
  };
}
