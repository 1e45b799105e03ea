import { getActor } from '@/lib/auth/actor';
import { errorResponse, privateJson, readJson } from '@/lib/http/responses';
import { assertSameOrigin } from '@/lib/http/same-origin';
import { updateUserAccess } from '@/lib/services/accounts';

export const dynamic = 'force-dynamic';

/** Admins: `{ "role"?: Role, "disabled"?: boolean }` for one user; every change is audited. */
export async function PATCH(req: Request, { params }: { params: Promise<{ id: string }> }) {
  try {
    assertSameOrigin(req);
    const { id } = await params;
    return privateJson({ user: await updateUserAccess(await getActor(), id, await readJson(req)) });
  } catch (err) {
    return errorResponse(err);
  }
}
