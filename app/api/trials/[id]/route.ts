import { NextResponse } from 'next/server';
import { getActor } from '@/lib/auth/actor';
import { readJson } from '@/lib/http/body';
import { errorResponse } from '@/lib/http/respond';
import { revalidateTrial } from '@/lib/http/revalidate';
import { assertSameOrigin } from '@/lib/http/same-origin';
import { trialDetailOf, trialIdOf } from '@/lib/http/trial-route';
import { updateTrial } from '@/lib/services/trials';
import { TrialUpdateSchema } from '@/lib/validation/trials';

export const dynamic = 'force-dynamic';

type Ctx = { params: Promise<{ id: string }> };

/** One trial with its check-ins, photos, outcome and paired trial. */
export async function GET(_request: Request, { params }: Ctx) {
  try {
    const trial = await trialDetailOf((await params).id, await getActor());
    return NextResponse.json(trial, { headers: { 'Cache-Control': 'no-store' } });
  } catch (err) {
    return errorResponse(err);
  }
}

/** Changes a trial's details (its owner or a moderator); `version` must be the one last read. */
export async function PATCH(request: Request, { params }: Ctx) {
  try {
    assertSameOrigin(request);
    const id = trialIdOf((await params).id);
    const body = TrialUpdateSchema.parse(await readJson(request));
    const updated = await updateTrial(await getActor(), id, body);
    await revalidateTrial(id);
    return NextResponse.json(updated, { headers: { 'Cache-Control': 'no-store' } });
  } catch (err) {
    return errorResponse(err);
  }
}
