import { getActor } from '@/lib/auth/actor';
import { parseId } from '@/lib/http/params';
import { errorResponse, privateJson } from '@/lib/http/responses';
import { assertSameOrigin } from '@/lib/http/same-origin';
import { claimProposal } from '@/lib/services/proposals';

export const dynamic = 'force-dynamic';

/** A reviewer claims a proposal for a while so nobody else decides it meanwhile. */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  try {
    assertSameOrigin(req);
    const id = parseId((await ctx.params).id);
    const { claimedUntil } = await claimProposal(await getActor(), id);
    return privateJson({ claimedUntil: claimedUntil.toISOString() });
  } catch (err) {
    return errorResponse(err);
  }
}
