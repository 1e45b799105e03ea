import { NextResponse } from 'next/server';
import { getActor } from '@/lib/auth/actor';
import { NotFoundError } from '@/lib/errors';
import { readJson } from '@/lib/http/body';
import { errorResponse, parseId } from '@/lib/http/respond';
import { revalidateTrial } from '@/lib/http/revalidate';
import { assertSameOrigin } from '@/lib/http/same-origin';
import { getTrialDetail } from '@/lib/queries/trials';
import { updateTrial } from '@/lib/services/trials';
import { TrialUpdateSchema } from '@/lib/validation/trials';

export const dynamic = 'force-dynamic';

type Ctx = { params: Promise<{ id: string }> };

/** One trial with its check-ins, photos, outcome and paired trial. */
export async function GET(_request: Request, { params }: Ctx) {
  try {
    const id = parseId((await params).id);
    const trial = id ? await getTrialDetail(id, await getActor()) : null;
    if (!trial) throw new NotFoundError('No such trial.');
    return NextResponse.json(trial, { headers: { 'Cache-Control': 'no-store' } });
  } catch (err) {
    return errorResponse(err);
  }
}

/** Changes a trial's details (its owner or a moderator); `version` must be the one last read. */
export async function PATCH(request: Request, { params }: Ctx) {
  try {
    assertSameOrigin(request);
    const id = parseId((await params).id);
    if (!id) throw new NotFoundError('No such trial.');
    const body = TrialUpdateSchema.parse(await readJson(request));
    const updated = await updateTrial(await getActor(), id, body);
    await revalidateTrial(id);
    return NextResponse.json(updated, { headers: { 'Cache-Control': 'no-store' } });
  } catch (err) {
    return errorResponse(err);
  }
}
