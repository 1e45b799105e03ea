import { getActor } from '@/lib/auth/actor';
import { parseId } from '@/lib/http/params';
import { revalidateProposal } from '@/lib/http/revalidate';
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
    const created = await resubmitProposal(await getActor(), id, body);
    await revalidateProposal(created.id);
    return privateJson(created, 201);
  } catch (err) {
    return errorResponse(err);
  }
}
