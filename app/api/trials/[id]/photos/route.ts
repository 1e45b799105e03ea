import { NextResponse } from 'next/server';
import { getActor } from '@/lib/auth/actor';
import { assertDeclaredLength, readLimited } from '@/lib/http/body';
import { errorResponse } from '@/lib/http/respond';
import { revalidateTrial } from '@/lib/http/revalidate';
import { assertSameOrigin } from '@/lib/http/same-origin';
import { trialDetailOf, trialIdOf } from '@/lib/http/trial-route';
import { PHOTO_MAX_BYTES } from '@/lib/photos/process';
import { assertCanUploadPhoto, uploadPhoto } from '@/lib/services/photos';
import { PhotoUploadQuerySchema } from '@/lib/validation/trials';

export const dynamic = 'force-dynamic';

type Ctx = { params: Promise<{ id: string }> };

/** Every photo of the trial (its own and its check-ins'). */
export async function GET(_request: Request, { params }: Ctx) {
  try {
    const trial = await trialDetailOf((await params).id);
    const photos = [...trial.photos, ...trial.checkIns.flatMap((c) => c.photos)].sort((a, b) => a.id - b.id);
    return NextResponse.json({ trialId: trial.id, photos }, { headers: { 'Cache-Control': 'no-store' } });
  } catch (err) {
    return errorResponse(err);
  }
}

/**
 * Uploads one photo: the request body is the image file itself (any declared
 * Content-Type; the content decides), `?checkInId=` attaches it to a check-in,
 * `?caption=` describes it. A body over 10 MB is refused with 413 — by its
 * Content-Length before anything else, or while streaming — and never buffered whole.
 */
export async function POST(request: Request, { params }: Ctx) {
  try {
    assertSameOrigin(request);
    assertDeclaredLength(request, PHOTO_MAX_BYTES);
    const id = trialIdOf((await params).id);
    const options = PhotoUploadQuerySchema.parse(Object.fromEntries(new URL(request.url).searchParams));
    const actor = await getActor();
    await assertCanUploadPhoto(actor, id);
    const bytes = await readLimited(request.body, PHOTO_MAX_BYTES);
    const photo = await uploadPhoto(actor, id, bytes, options);
    await revalidateTrial(id);
    return NextResponse.json(photo, { status: 201, headers: { Location: photo.url, 'Cache-Control': 'no-store' } });
  } catch (err) {
    return errorResponse(err);
  }
}
