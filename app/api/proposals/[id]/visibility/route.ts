import { getActor } from '@/lib/auth/actor';
import { parseId } from '@/lib/http/params';
import { revalidateProposal } from '@/lib/http/revalidate';
import { errorResponse, privateJson, readJson } from '@/lib/http/responses';
import { assertSameOrigin } from '@/lib/http/same-origin';
import { setProposalHidden } from '@/lib/services/proposals';

export const dynamic = 'force-dynamic';

/** Moderators hide or restore a proposal: `{ hidden, reason }` (audit-logged). */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  try {
    assertSameOrigin(req);
    const id = parseId((await ctx.params).id);
    await setProposalHidden(await getActor(), id, await readJson(req));
    await revalidateProposal(id);
    return privateJson({ ok: true });
  } catch (err) {
    return errorResponse(err);
  }
}
