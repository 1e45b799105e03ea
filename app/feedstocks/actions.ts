'use server';

import { redirect } from 'next/navigation';
import { updateTag } from 'next/cache';
import { getActor } from '@/lib/auth/actor';
import { FEEDSTOCKS_TAG, feedstockTag } from '@/lib/cache-tags';
import { NotFoundError, toActionState, type ActionState } from '@/lib/errors';
import { invalidateSearchIndex } from '@/lib/queries/search';
import { createFeedstock, decideFeedstockRequest, mergeFeedstocks, renameFeedstock, requestFeedstock } from '@/lib/services/feedstocks';
import { reviewPageEdit, revertPageText, submitPageEdit } from '@/lib/services/revisions';

/*
 * Server actions for the wiki: each gets the actor from the session, hands the
 * raw form to one service (which validates with the shared zod schema and
 * authorizes), then drops the cache tags the write touched. Errors come back
 * as a form state with field messages; nothing is half-saved.
 */

/** Form fields as a plain object (the services validate them). */
function fields(formData: FormData): Record<string, FormDataEntryValue | FormDataEntryValue[]> {
  const out: Record<string, FormDataEntryValue | FormDataEntryValue[]> = {};
  for (const key of new Set(formData.keys())) {
    if (key.startsWith('$ACTION')) continue;
    const all = formData.getAll(key);
    out[key] = all.length > 1 ? all : all[0];
  }
  return out;
}

/** An id from a hidden form field, checked (form fields come back from the browser as sent). */
function idOf(x: unknown): number {
  const n = Number(x);
  if (!Number.isInteger(n) || n <= 0) throw new NotFoundError();
  return n;
}

function touched(...ids: number[]) {
  for (const id of ids) updateTag(feedstockTag(id));
  updateTag(FEEDSTOCKS_TAG);
  invalidateSearchIndex();
}

/** State of the edit form: on success, what happened. */
export type EditFormState = ActionState & { status?: 'published' | 'pending'; version?: number };

/** Saves a page-text edit (editors publish; contributors' edits wait for review). */
export async function submitPageEditAction(_prev: EditFormState, formData: FormData): Promise<EditFormState> {
  let slug: string;
  try {
    const r = await submitPageEdit(await getActor(), idOf(formData.get('feedstockId')), fields(formData));
    if (r.status === 'pending') return { ok: true, status: 'pending', version: r.version, message: 'Thanks: your edit is waiting for an editor to review it.' };
    touched(r.feedstockId);
    slug = r.slug;
  } catch (err) {
    return toActionState(err);
  }
  redirect(`/feedstocks/${slug}`);
}

/**
 * An editor approves or rejects a suggested edit; goes back to the queue,
 * which says what was decided (the decided edit leaves the list, and its
 * form with it, so the form cannot show the outcome itself).
 */
export async function reviewEditAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  let decided: number;
  try {
    const r = await reviewPageEdit(await getActor(), idOf(formData.get('revisionId')), fields(formData));
    if (r.status === 'published') touched(r.feedstockId);
    decided = r.revisionId;
  } catch (err) {
    return toActionState(err);
  }
  redirect(`/review/edits?decided=${decided}`);
}

/** An editor reverts the page text to an earlier published revision. */
export async function revertAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  try {
    const r = await revertPageText(await getActor(), idOf(formData.get('feedstockId')), fields(formData));
    touched(r.feedstockId);
    return { ok: true, message: `Reverted: the old text is now version ${r.version}.` };
  } catch (err) {
    return toActionState(err);
  }
}

/** State of the request form. */
export type RequestFormState = ActionState & { name?: string };

/** Anyone asks for a feedstock the site does not have. */
export async function requestFeedstockAction(_prev: RequestFormState, formData: FormData): Promise<RequestFormState> {
  try {
    const r = await requestFeedstock(await getActor(), fields(formData));
    return { ok: true, name: r.name, message: `Thanks: “${r.name}” is on the editors’ list of requested feedstocks.` };
  } catch (err) {
    return toActionState(err);
  }
}

/** An editor declines or reopens a request. */
export async function decideRequestAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  try {
    const r = await decideFeedstockRequest(await getActor(), fields(formData));
    return { ok: true, message: r.status === 'declined' ? 'Request declined.' : 'Request reopened.' };
  } catch (err) {
    return toActionState(err);
  }
}

/** An editor creates a feedstock; goes to its page. */
export async function createFeedstockAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  let slug: string;
  try {
    const r = await createFeedstock(await getActor(), fields(formData));
    touched(r.id);
    slug = r.slug;
  } catch (err) {
    return toActionState(err);
  }
  redirect(`/feedstocks/${slug}`);
}

/** An editor renames a feedstock or moves it to a new address; goes to the new address. */
export async function renameFeedstockAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  let slug: string;
  try {
    const r = await renameFeedstock(await getActor(), idOf(formData.get('feedstockId')), fields(formData));
    touched(r.id);
    slug = r.slug;
  } catch (err) {
    return toActionState(err);
  }
  redirect(`/feedstocks/${slug}`);
}

/** An editor merges this feedstock into another; goes to the target. */
export async function mergeFeedstockAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  let slug: string;
  try {
    const r = await mergeFeedstocks(await getActor(), { ...fields(formData), sourceId: idOf(formData.get('sourceId')) });
    touched(r.source.id, r.target.id);
    slug = r.target.slug;
  } catch (err) {
    return toActionState(err);
  }
  redirect(`/feedstocks/${slug}`);
}
