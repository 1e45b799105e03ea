import { NextResponse } from 'next/server';
import { toErrorResponse } from '@/lib/errors';

/** A JSON error response for any thrown error (lib/errors.ts decides status and body). */
export function errorResponse(err: unknown): NextResponse {
  const { status, body } = toErrorResponse(err);
  return NextResponse.json(body, { status, headers: { 'Cache-Control': 'no-store' } });
}

/** Parses a positive integer route parameter; null when it is not one. */
export function parseId(raw: string): number | null {
  return /^[1-9]\d{0,9}$/.test(raw) && Number(raw) <= 4_294_967_295 ? Number(raw) : null;
}
