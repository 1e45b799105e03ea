import { NextResponse } from 'next/server';
import { getActor } from '@/lib/auth/actor';
import { readJson } from '@/lib/http/body';
import { errorResponse } from '@/lib/http/respond';
import { revalidateTrial } from '@/lib/http/revalidate';
import { assertSameOrigin } from '@/lib/http/same-origin';
import { trialIdOf } from '@/lib/http/trial-route';
import { closeTrial } from '@/lib/services/trials';
import { TrialCloseSchema } from '@/lib/validation/trials';

export const dynamic = 'force-dynamic';

/**
 * Closes or abandons a trial. The engine proposes the outcome from the
 * check-ins; `outcome` confirms or corrects it (a correction needs a `reason`).
 */
export async function POST(request: Request, { params }: { params: Promise<{ id: string }> }) {
  try {
    assertSameOrigin(request);
    const id = trialIdOf((await params).id);
    const body = TrialCloseSchema.parse(await readJson(request));
    const closed = await closeTrial(await getActor(), id, body);
    await revalidateTrial(id);
    return NextResponse.json(closed, { headers: { 'Cache-Control': 'no-store' } });
  } catch (err) {
    return errorResponse(err);
  }
}
