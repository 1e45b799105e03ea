import { exportResponse } from '@/lib/http/export-response';

export const dynamic = 'force-dynamic';

/** One feedstock's trials with their check-ins as JSON, CC BY-SA 4.0. */
export async function GET(request: Request, { params }: { params: Promise<{ slug: string }> }) {
  return exportResponse(request, { feedstockSlug: (await params).slug, format: 'json' });
}
