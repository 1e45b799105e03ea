import { ForbiddenError } from '@/lib/errors';

/**
 * Refuses a cross-site write: throws ForbiddenError (403) when the request's
 * Origin header names another host than the request's own Host header (or the
 * host of AUTH_URL, the public address). A request without Origin passes
 * unless the browser marks it `Sec-Fetch-Site: cross-site`; non-browser
 * clients (scripts, curl) send neither and cannot ride a visitor's cookies.
 */
export function assertSameOrigin(request: Request): void {
  const origin = request.headers.get('origin');
  if (!origin) {
    if (request.headers.get('sec-fetch-site') === 'cross-site') throw new ForbiddenError('Cross-site requests are not accepted.');
    return;
  }
  let originHost: string;
  try {
    originHost = new URL(origin).host.toLowerCase();
  } catch {
    throw new ForbiddenError('Cross-site requests are not accepted.'); // "null" and garbage
  }
  const allowed = new Set<string>();
  const host = request.headers.get('host');
  if (host) allowed.add(host.toLowerCase());
  const publicUrl = process.env.AUTH_URL;
  if (publicUrl) {
    try {
      allowed.add(new URL(publicUrl).host.toLowerCase());
    } catch {
      // a bad AUTH_URL is reported by lib/env.ts; the Host header still applies
    }
  }
  if (!allowed.has(originHost)) throw new ForbiddenError('Cross-site requests are not accepted.');
}
