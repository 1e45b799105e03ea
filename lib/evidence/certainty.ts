/**
 * Certainty of a verdict in GRADE terms (high / moderate / low / very low):
 * a base grade from the number of independent contributors, lowered for risk
 * of bias, inconsistency and imprecision, each with named reasons.
 * Indirectness is not assessed here: every group is judged only on trials in
 * its own setting and preparation, so its evidence is direct.
 */
import {
  CERTAINTY_BASE_BY_CONTRIBUTORS,
  IMPRECISION_MAX_WIDTH,
  IMPRECISION_MIN_TRIALS,
  INCONSISTENCY_MIN_DISAGREEMENT,
  MIN_CONTROL_SHARE,
  MIN_PHOTO_SHARE,
} from './thresholds';
import type { Certainty, CertaintyDowngrade, CertaintyGrade } from './types';

/** Grades from best to worst. */
export const CERTAINTY_GRADES: readonly CertaintyGrade[] = ['high', 'moderate', 'low', 'very low'];

/** What the certainty grade is computed from. */
export interface CertaintyInput {
  finished: number;
  finishedContributors: number;
  withControl: number;
  withPhotos: number;
  /** Finished trials whose outcome disagrees with the monotone fit. */
  disagreements: number;
  successLower: number | null;
  successUpper: number | null;
}

const EPS = 1e-12;

/** Base grade for a number of independent contributors (table in thresholds.ts). Throws RangeError on a negative count. */
export function baseGrade(contributors: number): CertaintyGrade {
  if (!Number.isInteger(contributors) || contributors < 0) throw new RangeError('contributors must be a whole number ≥ 0');
  for (const row of CERTAINTY_BASE_BY_CONTRIBUTORS) if (contributors >= row.min) return row.grade;
  return 'very low';
}

/**
 * Certainty grade with its base and named downgrades.
 * Risk of bias: one level per missing safeguard (controls in fewer than half
 * of finished trials; photos in fewer than half). Inconsistency: one level when
 * at least a quarter of finished trials disagree with the load pattern.
 * Imprecision: one level with fewer than 5 finished trials or a Wilson
 * interval wider than 0.5. Never below very low. Throws RangeError on impossible counts.
 */
export function gradeCertainty(input: CertaintyInput): Certainty {
  const { finished, finishedContributors, withControl, withPhotos, disagreements } = input;
  for (const [k, v] of Object.entries({ finished, finishedContributors, withControl, withPhotos, disagreements })) {
    if (!Number.isInteger(v) || v < 0) throw new RangeError(`${k} must be a whole number ≥ 0`);
  }
  if (withControl > finished || withPhotos > finished || disagreements > finished) throw new RangeError('counts exceed finished trials');
  const base = baseGrade(finishedContributors);
  const baseReason =
    finishedContributors === 0
      ? 'started at very low with no finished trials'
      : finishedContributors === 1
      ? 'started at very low with finished trials from 1 keeper'
      : `started at ${base} with finished trials from ${finishedContributors} independent keepers`;
  const downgrades: CertaintyDowngrade[] = [];
  if (finished > 0) {
    const bias: string[] = [];
    if (withControl / finished < MIN_CONTROL_SHARE - EPS) bias.push(`no control plot in ${finished - withControl} of ${finished} finished trials`);
    if (withPhotos / finished < MIN_PHOTO_SHARE - EPS) bias.push(`no photos in ${finished - withPhotos} of ${finished} finished trials`);
    if (bias.length > 0) downgrades.push({ domain: 'risk of bias', levels: bias.length, reasons: bias });
    if (disagreements / finished >= INCONSISTENCY_MIN_DISAGREEMENT - EPS) {
      downgrades.push({
        domain: 'inconsistency',
        levels: 1,
        reasons: [`outcomes split in a way load does not explain: ${disagreements} of ${finished} finished trials go against the load pattern`],
      });
    }
  }
  const imprecision: string[] = [];
  if (finished < IMPRECISION_MIN_TRIALS) imprecision.push(finished === 1 ? 'only 1 finished trial' : `only ${finished} finished trials`);
  if (input.successLower !== null && input.successUpper !== null && input.successUpper - input.successLower > IMPRECISION_MAX_WIDTH + EPS) {
    imprecision.push(
      `wide interval for the consumed share (${Math.round(input.successLower * 100)}–${Math.round(input.successUpper * 100)}%)`,
    );
  }
  if (imprecision.length > 0) downgrades.push({ domain: 'imprecision', levels: 1, reasons: imprecision });
  const total = downgrades.reduce((s, d) => s + d.levels, 0);
  const idx = Math.min(CERTAINTY_GRADES.length - 1, CERTAINTY_GRADES.indexOf(base) + total);
  return { grade: CERTAINTY_GRADES[idx], base, baseReason, downgrades };
}
