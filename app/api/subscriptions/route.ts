import { getActor } from '@/lib/auth/actor';
import { errorResponse, privateJson } from '@/lib/http/responses';
import { listMySubscriptions } from '@/lib/queries/subscriptions';

export const dynamic = 'force-dynamic';

/**
 * GET /api/subscriptions — the caller's subscriptions and whether one click
 * is enough to follow (the subscribe panel asks this with SWR, so the pages
 * that embed it stay cacheable). Visitors get `{ signedIn: false, subscriptions: [] }`.
 */
export async function GET() {
  try {
    return privateJson(await listMySubscriptions(await getActor()));
  } catch (err) {
    return errorResponse(err);
  }
}
