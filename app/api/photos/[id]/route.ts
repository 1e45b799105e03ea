import { getActor } from '@/lib/auth/actor';
import { NotFoundError } from '@/lib/errors';
import { photoResponse } from '@/lib/http/photo-response';
import { errorResponse, parseId } from '@/lib/http/respond';
import { revalidateTrial } from '@/lib/http/revalidate';
import { assertSameOrigin } from '@/lib/http/same-origin';
import { deletePhoto } from '@/lib/services/photos';

export const dynamic = 'force-dynamic';

type Ctx = { params: Promise<{ id: string }> };

/** The photo itself (re-encoded, no metadata). */
export async function GET(request: Request, { params }: Ctx) {
  return photoResponse(request, (await params).id, 'full');
}

/** Removes a photo (the trial's owner or a moderator); the evidence is recomputed. */
export async function DELETE(request: Request, { params }: Ctx) {
  try {
    assertSameOrigin(request);
    const id = parseId((await params).id);
    if (!id) throw new NotFoundError('No such photo.');
    const { trialId } = await deletePhoto(await getActor(), id);
    await revalidateTrial(trialId);
    return new Response(null, { status: 204 });
  } catch (err) {
    return errorResponse(err);
  }
}
