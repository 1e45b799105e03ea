import { revalidatePath } from 'next/cache';
import { getTrialFeedstockSlug } from '@/lib/queries/trials';

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
