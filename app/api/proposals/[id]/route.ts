import { getActor } from '@/lib/auth/actor';
import { NotFoundError } from '@/lib/errors';
import { parseId } from '@/lib/http/params';
import { errorResponse, privateJson } from '@/lib/http/responses';
import { getProposal } from '@/lib/queries/proposals';

export const dynamic = 'force-dynamic';

/** A proposal with its tally and votes, as the viewer may see it (polled by the page through SWR). */
export async function GET(_req: Request, ctx: { params: Promise<{ id: string }> }) {
  try {
    const proposal = await getProposal(parseId((await ctx.params).id), await getActor());
    if (!proposal) throw new NotFoundError('No such proposal.');
    return privateJson(proposal);
  } catch (err) {
    return errorResponse(err);
  }
}
