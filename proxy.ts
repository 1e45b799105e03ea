import { NextResponse, type NextRequest } from 'next/server';
import { SESSION_COOKIE_NAMES } from '@/lib/auth/cookies';
import { isMailboxEnabled } from '@/lib/env';

/**
 * Sends signed-out visitors from private pages to /signin (and back after).
 * It only looks for the session cookie: it is a convenience, never the
 * security boundary — every page, route handler, server action and service
 * checks the session and the policies itself.
 *
 * Also answers 404 for the development-only /dev pages when they are off, so
 * the status is right (the page itself streams, and would say 200).
 */
export function proxy(req: NextRequest) {
  if (req.nextUrl.pathname.startsWith('/dev/')) {
    return isMailboxEnabled() ? NextResponse.next() : NextResponse.rewrite(new URL('/_not-found', req.url), { status: 404 });
  }
  // Only page visits are redirected; a POST (a server action) reaches its own checks and answers for itself.
  if (req.method !== 'GET' && req.method !== 'HEAD') return NextResponse.next();
  const hasSession = SESSION_COOKIE_NAMES.some((name) => !!req.cookies.get(name)?.value);
  if (hasSession) return NextResponse.next();
  const url = req.nextUrl.clone();
  url.pathname = '/signin';
  url.search = '';
  url.searchParams.set('callbackUrl', `${req.nextUrl.pathname}${req.nextUrl.search}`);
  return NextResponse.redirect(url);
}

/** Private pages: a visitor has nothing to do there without an account. */
export const config = {
  matcher: ['/dev/:path*', '/account', '/account/:path*', '/admin', '/admin/:path*', '/review', '/review/:path*', '/trials/new', '/feedstocks/:slug/edit', '/feedstocks/:slug/propose'],
};
