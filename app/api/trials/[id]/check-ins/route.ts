import { NextResponse } from 'next/server';
import { getActor } from '@/lib/auth/actor';
import { readJson } from '@/lib/http/body';
import { errorResponse } from '@/lib/http/respond';
import { revalidateTrial } from '@/lib/http/revalidate';
import { assertSameOrigin } from '@/lib/http/same-origin';
import { trialDetailOf, trialIdOf } from '@/lib/http/trial-route';
import { addCheckIn } from '@/lib/services/trials';
import { CheckInCreateSchema } from '@/lib/validation/trials';

export const dynamic = 'force-dynamic';

type Ctx = { params: Promise<{ id: string }> };

/** The trial's check-ins, oldest first, with their photos. */
export async function GET(_request: Request, { params }: Ctx) {
  try {
    const trial = await trialDetailOf((await params).id);
    return NextResponse.json({ trialId: trial.id, checkIns: trial.checkIns }, { headers: { 'Cache-Control': 'no-store' } });
  } catch (err) {
    return errorResponse(err);
  }
}

/** Adds a check-in (the trial's owner or a moderator). The body is checked before the session. */
export async function POST(request: Request, { params }: Ctx) {
  try {
    assertSameOrigin(request);
    const id = trialIdOf((await params).id);
    const body = CheckInCreateSchema.parse(await readJson(request));
    const created = await addCheckIn(await getActor(), id, body);
    await revalidateTrial(id);
    return NextResponse.json(created, { status: 201, headers: { 'Cache-Control': 'no-store' } });
  } catch (err) {
    return errorResponse(err);
  }
}
