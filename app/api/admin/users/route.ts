import type { NextRequest } from 'next/server';
import { getActor } from '@/lib/auth/actor';
import { errorResponse, privateJson } from '@/lib/http/responses';
import { listUsers } from '@/lib/queries/accounts';

export const dynamic = 'force-dynamic';

/** Admins: users newest first, `?q=` filters by name or e-mail, `?page=` pages by 25. */
export async function GET(req: NextRequest) {
  try {
    return privateJson(await listUsers(await getActor(), Object.fromEntries(req.nextUrl.searchParams)));
  } catch (err) {
    return errorResponse(err);
  }
}
