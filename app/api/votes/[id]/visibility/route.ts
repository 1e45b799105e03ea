import { getActor } from '@/lib/auth/actor';
import { parseId } from '@/lib/http/params';
import { revalidateVote } from '@/lib/http/revalidate';
import { errorResponse, privateJson, readJson } from '@/lib/http/responses';
import { assertSameOrigin } from '@/lib/http/same-origin';
import { setVoteHidden } from '@/lib/services/proposals';

export const dynamic = 'force-dynamic';

/** Moderators hide or restore a vote and its comment: `{ hidden, reason }` (audit-logged). */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  try {
    assertSameOrigin(req);
    const id = parseId((await ctx.params).id);
    await setVoteHidden(await getActor(), id, await readJson(req));
    await revalidateVote(id);
    return privateJson({ ok: true });
  } catch (err) {
    return errorResponse(err);
  }
}
