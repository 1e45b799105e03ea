/**
 * The consensus rule, in one place. A proposal is *ready* for a moderator when
 * at least READY_MIN_VOTES votes count and at least READY_AGREE_SHARE of them
 * agree. Only visible votes count; the proposer cannot vote on their own
 * proposal (lib/policies), and votes alone never publish anything.
 */
export const READY_MIN_VOTES = 3;
export const READY_AGREE_SHARE = 2 / 3;

/** Vote counts of a proposal and whether the consensus rule calls it ready. */
export interface Tally {
  agree: number;
  disagree: number;
  total: number;
  ready: boolean;
  /** What is still missing, in words, when not ready. */
  missing: string | null;
}

/** Applies the consensus rule to counts of agreeing and disagreeing votes. */
export function tallyVotes(agree: number, disagree: number): Tally {
  const total = agree + disagree;
  const enoughVotes = total >= READY_MIN_VOTES;
  const enoughAgree = total > 0 && agree / total >= READY_AGREE_SHARE - 1e-12;
  let missing: string | null = null;
  if (!enoughVotes) missing = `${READY_MIN_VOTES - total} more vote${READY_MIN_VOTES - total === 1 ? '' : 's'} needed`;
  else if (!enoughAgree) missing = 'fewer than two thirds agree';
  return { agree, disagree, total, ready: enoughVotes && enoughAgree, missing };
}
