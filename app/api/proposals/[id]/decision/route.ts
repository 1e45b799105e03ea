import { revalidatePath } from 'next/cache';
import { getActor } from '@/lib/auth/actor';
import { parseId } from '@/lib/http/params';
import { errorResponse, privateJson, readJson } from '@/lib/http/responses';
import { assertSameOrigin } from '@/lib/http/same-origin';
import { decideProposal } from '@/lib/services/proposals';

export const dynamic = 'force-dynamic';

/** A moderator approves or rejects: `{ decision: 'approve'|'reject', note }`. 409 when the proposal is stale. */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  try {
    assertSameOrigin(req);
    const id = parseId((await ctx.params).id);
    const result = await decideProposal(await getActor(), id, await readJson(req));
    revalidatePath('/', 'layout');
    return privateJson(result);
  } catch (err) {
    return errorResponse(err);
  }
}
