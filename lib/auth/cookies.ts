/**
 * The Auth.js session cookie, named and shaped as Auth.js does it, so a
 * session we open ourselves (demo sign-in) and one Auth.js opens look the same.
 * Pure: no database, safe to import from proxy.ts.
 */

/** Auth.js's base name of the database-session cookie. */
export const SESSION_COOKIE_BASE = 'authjs.session-token';

/** Both names the session cookie can have (plain on http, `__Secure-` on https). */
export const SESSION_COOKIE_NAMES = [SESSION_COOKIE_BASE, `__Secure-${SESSION_COOKIE_BASE}`] as const;

/** Sessions last 30 days (Auth.js's default), renewed at most once a day. */
export const SESSION_MAX_AGE_SECONDS = 30 * 24 * 60 * 60;
export const SESSION_UPDATE_AGE_SECONDS = 24 * 60 * 60;

/** True when the public address is https: cookies are then Secure and `__Secure-` prefixed. */
export function usesSecureCookies(authUrl: string): boolean {
  return new URL(authUrl).protocol === 'https:';
}

/** The session cookie's name for a public address. */
export function sessionCookieName(authUrl: string): string {
  return usesSecureCookies(authUrl) ? `__Secure-${SESSION_COOKIE_BASE}` : SESSION_COOKIE_BASE;
}

/** Attributes of the session cookie: HttpOnly, SameSite=Lax, whole site, Secure behind https. */
export function sessionCookieOptions(authUrl: string, expires: Date) {
  return {
    httpOnly: true,
    sameSite: 'lax' as const,
    path: '/',
    secure: usesSecureCookies(authUrl),
    expires,
  };
}
