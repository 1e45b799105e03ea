import 'server-only';
import { cookies } from 'next/headers';
import { getEnv } from '@/lib/env';
import { sessionCookieName, sessionCookieOptions } from './cookies';

/**
 * Sets the Auth.js session cookie for a session row we created ourselves
 * (demo sign-in), with the name and attributes Auth.js uses, so auth() and
 * Auth.js's sign-out treat it like any other session. Server actions and
 * route handlers only (it writes a cookie).
 */
export async function writeSessionCookie(sessionToken: string, expires: Date): Promise<void> {
  const { AUTH_URL } = getEnv();
  (await cookies()).set(sessionCookieName(AUTH_URL), sessionToken, sessionCookieOptions(AUTH_URL, expires));
}
