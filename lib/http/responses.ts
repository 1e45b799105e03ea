import { NextResponse } from 'next/server';
import { RateLimitedError, toErrorResponse } from '@/lib/errors';

/** A JSON error response for a route handler, with Retry-After on 429 and no caching. */
export function errorResponse(err: unknown): NextResponse {
  const { status, body } = toErrorResponse(err);
  const headers: Record<string, string> = { 'Cache-Control': 'no-store' };
  if (err instanceof RateLimitedError) headers['Retry-After'] = String(err.retryAfterSeconds);
  return NextResponse.json(body, { status, headers });
}

/** A JSON success response that is never cached (it depends on who asks). */
export function privateJson(body: unknown, status = 200): NextResponse {
  return NextResponse.json(body, { status, headers: { 'Cache-Control': 'private, no-store' } });
}

/**
 * Reads a JSON body; a body that is not JSON reads as null, which the
 * service's zod schema then refuses with a 400 — after the service has
 * checked who is asking, so a visitor gets 401 whatever they send.
 */
export async function readJson(req: Request): Promise<unknown> {
  try {
    return await req.json();
  } catch {
    return null;
  }
}
