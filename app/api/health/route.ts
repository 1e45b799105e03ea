import { NextResponse } from 'next/server';
import { checkDatabase } from '@/lib/queries/health';

export const dynamic = 'force-dynamic';

/** Liveness and database status: 200 when MariaDB answers, 503 when it does not. */
export async function GET() {
  const db = await checkDatabase();
  return NextResponse.json(
    { status: db.ok ? 'ok' : 'degraded', database: db },
    { status: db.ok ? 200 : 503, headers: { 'Cache-Control': 'no-store' } },
  );
}
