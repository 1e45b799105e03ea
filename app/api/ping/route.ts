import { NextResponse } from 'next/server';

/**
 * GET /api/ping — answers without touching the database: a liveness probe for
 * a load balancer (is this process serving?), and the benchmark's baseline for
 * the cost of a route handler. /api/health checks the database too.
 */
export function GET() {
  return NextResponse.json({ ok: true }, { headers: { 'Cache-Control': 'no-store' } });
}
