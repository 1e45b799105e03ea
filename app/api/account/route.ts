import { getActor } from '@/lib/auth/actor';
import { errorResponse, privateJson, readJson } from '@/lib/http/responses';
import { assertSameOrigin } from '@/lib/http/same-origin';
import { getAccount } from '@/lib/queries/accounts';
import { updateAccountSettings } from '@/lib/services/accounts';

export const dynamic = 'force-dynamic';

/** The signed-in person's account, or `{ account: null }` for a visitor (the header asks this on every page). */
export async function GET() {
  try {
    const actor = await getActor();
    return privateJson({ account: actor ? await getAccount(actor) : null });
  } catch (err) {
    return errorResponse(err);
  }
}

/** Saves settings: `{ "units": "metric" | "imperial" }`. */
export async function PATCH(req: Request) {
  try {
    assertSameOrigin(req);
    return privateJson(await updateAccountSettings(await getActor(), await readJson(req)));
  } catch (err) {
    return errorResponse(err);
  }
}
