import { revalidatePath } from 'next/cache';
import { getActor } from '@/lib/auth/actor';
import { revalidateProposal } from '@/lib/http/revalidate';
import { errorResponse, privateJson, readJson } from '@/lib/http/responses';
import { assertSameOrigin } from '@/lib/http/same-origin';
import { createProposal } from '@/lib/services/proposals';

export const dynamic = 'force-dynamic';

/** Opens a verdict proposal: `{ feedstockId, settings[], rationale, trialIds[] }` → 201 `{ id }`. */
export async function POST(req: Request) {
  try {
    assertSameOrigin(req);
    const created = await createProposal(await getActor(), await readJson(req));
    revalidatePath('/review');
    await revalidateProposal(created.id);
    return privateJson(created, 201);
  } catch (err) {
    return errorResponse(err);
  }
}
