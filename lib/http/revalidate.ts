import { revalidatePath, revalidateTag } from 'next/cache';
import { feedstockTag } from '@/lib/cache-tags';
import { getProposalFeedstockRef, getVoteFeedstockRef } from '@/lib/queries/proposals';
import { getTrialFeedstockSlug } from '@/lib/queries/trials';

/**
 * Feedstock pages are served from the Next.js page cache (they are the same
 * for every reader). A route handler or server action that changed something
 * a page shows calls one of these after its service returns, so the next
 * reader gets a fresh render. Writes made outside Next.js (the CLI's
 * recompute, the mail worker) reach the page within its `revalidate` window.
 */

/** Drops the cached page (and page data) of one feedstock at once. */
export function revalidateFeedstockPage(ref: { id: number; slug: string } | null): void {
  if (!ref) return;
  revalidateTag(feedstockTag(ref.id), { expire: 0 });
  revalidatePath(`/feedstocks/${ref.slug}`);
}

/** After a proposal was opened, resubmitted, hidden or restored, or voted on: its feedstock's page shows the tally. */
export async function revalidateProposal(proposalId: number): Promise<void> {
  revalidateFeedstockPage(await getProposalFeedstockRef(proposalId));
}

/** After a vote was hidden or restored. */
export async function revalidateVote(voteId: number): Promise<void> {
  revalidateFeedstockPage(await getVoteFeedstockRef(voteId));
}

/**
 * Drops cached renderings of a trial, the trial list and its feedstock's page
 * after a write (the write recomputed the evidence in its transaction).
 */
export async function revalidateTrial(trialId: number): Promise<void> {
  revalidatePath(`/trials/${trialId}`);
  revalidatePath('/trials');
  revalidatePath('/feedstocks');
  const slug = await getTrialFeedstockSlug(trialId);
  if (slug) revalidatePath(`/feedstocks/${slug}`);
}
