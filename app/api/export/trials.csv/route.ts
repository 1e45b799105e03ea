import { exportResponse } from '@/lib/http/export-response';

export const dynamic = 'force-dynamic';

/** Every trial (or ?table=check-ins) as CSV (RFC 4180), CC BY-SA 4.0. */
export async function GET(request: Request) {
  return exportResponse(request, { format: 'csv' });
}
