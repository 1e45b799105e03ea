import { exportResponse } from '@/lib/http/export-response';

export const dynamic = 'force-dynamic';

/** Every trial with its check-ins as JSON, CC BY-SA 4.0. */
export async function GET(request: Request) {
  return exportResponse(request, { format: 'json' });
}
