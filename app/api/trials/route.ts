import { NextResponse } from 'next/server';
import { getActor } from '@/lib/auth/actor';
import { readJson } from '@/lib/http/body';
import { errorResponse } from '@/lib/http/respond';
import { revalidateTrial } from '@/lib/http/revalidate';
import { assertSameOrigin } from '@/lib/http/same-origin';
import { listTrials } from '@/lib/queries/trials';
import { createTrial } from '@/lib/services/trials';
import { TrialCreateSchema, TrialListQuerySchema } from '@/lib/validation/trials';

export const dynamic = 'force-dynamic';

/** The trial list: ?feedstock=<slug>&setting=&status=&contributor=<label>&page=. */
export async function GET(request: Request) {
  try {
    const query = TrialListQuerySchema.parse(Object.fromEntries(new URL(request.url).searchParams));
    return NextResponse.json(await listTrials(query), { headers: { 'Cache-Control': 'no-store' } });
  } catch (err) {
    return errorResponse(err);
  }
}

/** Logs a new trial (contributors). The body is checked before the session: its shape is public. */
export async function POST(request: Request) {
  try {
    assertSameOrigin(request);
    const body = TrialCreateSchema.parse(await readJson(request));
    const created = await createTrial(await getActor(), body);
    await revalidateTrial(created.id);
    return NextResponse.json(created, { status: 201, headers: { Location: `/api/trials/${created.id}`, 'Cache-Control': 'no-store' } });
  } catch (err) {
    return errorResponse(err);
  }
}
