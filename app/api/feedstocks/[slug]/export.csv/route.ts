import { exportResponse } from '@/lib/http/export-response';

export const dynamic = 'force-dynamic';

/** One feedstock's trials (or ?table=check-ins) as CSV (RFC 4180), CC BY-SA 4.0. */
export async function GET(request: Request, { params }: { params: Promise<{ slug: string }> }) {
  return exportResponse(request, { feedstockSlug: (await params).slug, format: 'csv' });
}
