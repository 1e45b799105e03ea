import { ForbiddenError } from '@/lib/errors';
import { getEnv } from '@/lib/env';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** The origins this site answers on: the public address, and the host the request itself names. */
function allowedOrigins(req: Request): Set<string> {
  const out = new Set<string>([new URL(getEnv().AUTH_URL).origin]);
  const host = req.headers.get('x-forwarded-host') ?? req.headers.get('host');
  if (host) {
    const proto = req.headers.get('x-forwarded-proto')?.split(',')[0]?.trim() || new URL(req.url).protocol.replace(':', '');
    out.add(`${proto}://${host}`);
  }
  return out;
}

/**
 * True unless a browser says the request comes from another site: an Origin
 * that is not ours (or "null"), or Sec-Fetch-Site: cross-site. Requests with
 * neither header are not from a browser page and carry no ambient cookies by
 * accident, so they pass (the session and policies still decide).
 */
export function isSameOriginRequest(req: Request): boolean {
  if (SAFE_METHODS.has(req.method.toUpperCase())) return true;
  const origin = req.headers.get('origin');
  if (origin !== null) return allowedOrigins(req).has(origin);
  return req.headers.get('sec-fetch-site') !== 'cross-site';
}

/**
 * The CSRF guard of every mutating JSON route handler: throws ForbiddenError
 * (403) for a state-changing request from a foreign origin. Server actions
 * have Next.js's own Origin check; Auth.js adds its CSRF token on top.
 */
export function assertSameOrigin(req: Request): void {
  if (!isSameOriginRequest(req)) throw new ForbiddenError('Cross-site request refused.');
}
