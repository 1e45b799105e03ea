import { getActor } from '@/lib/auth/actor';
import { parseId } from '@/lib/http/params';
import { revalidateProposal } from '@/lib/http/revalidate';
import { errorResponse, privateJson, readJson } from '@/lib/http/responses';
import { assertSameOrigin } from '@/lib/http/same-origin';
import { castVote } from '@/lib/services/proposals';

export const dynamic = 'force-dynamic';

/** Casts or changes the caller's vote: `{ agree, reason }` → the new tally. */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  try {
    assertSameOrigin(req);
    const id = parseId((await ctx.params).id);
    const tally = await castVote(await getActor(), id, await readJson(req));
    await revalidateProposal(id);
    return privateJson({ tally });
  } catch (err) {
    return errorResponse(err);
  }
}
