import { getActor } from '@/lib/auth/actor';
import { parseId } from '@/lib/http/params';
import { errorResponse, privateJson, readJson } from '@/lib/http/responses';
import { assertSameOrigin } from '@/lib/http/same-origin';
import { resubmitProposal } from '@/lib/services/proposals';

export const dynamic = 'force-dynamic';

/** The author turns a rejected or stale proposal into a new one, optionally revised. → 201 `{ id }`. */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  try {
    assertSameOrigin(req);
    const id = parseId((await ctx.params).id);
    const body = (await readJson(req)) ?? {};
    return privateJson(await resubmitProposal(await getActor(), id, body), 201);
  } catch (err) {
    return errorResponse(err);
  }
}
