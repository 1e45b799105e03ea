import { getActor } from '@/lib/auth/actor';
import { errorResponse, privateJson, readJson } from '@/lib/http/responses';
import { assertSameOrigin } from '@/lib/http/same-origin';
import { acceptLicence } from '@/lib/services/accounts';

export const dynamic = 'force-dynamic';

/** A reader accepts the contribution licence: `{ "accept": true }` → contributor. */
export async function POST(req: Request) {
  try {
    assertSameOrigin(req);
    return privateJson(await acceptLicence(await getActor(), await readJson(req)));
  } catch (err) {
    return errorResponse(err);
  }
}
