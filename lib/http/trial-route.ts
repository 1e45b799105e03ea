import { NotFoundError } from '@/lib/errors';
import type { Actor } from '@/lib/policies';
import { getTrialDetail, type TrialDetail } from '@/lib/queries/trials';
import { parseId } from './respond';

/**
 * The trial id of an /api/trials/[id]/… route. Throws NotFoundError (404,
 * "No such trial.") when the segment cannot be an id.
 */
export function trialIdOf(raw: string): number {
  const id = parseId(raw);
  if (!id) throw new NotFoundError('No such trial.');
  return id;
}

/**
 * The trial of an /api/trials/[id]/… route as `actor` may see it. Throws
 * NotFoundError (404, "No such trial.") for a bad id or a trial that is not there.
 */
export async function trialDetailOf(raw: string, actor: Actor = null): Promise<TrialDetail> {
  const id = parseId(raw);
  const trial = id ? await getTrialDetail(id, actor) : null;
  if (!trial) throw new NotFoundError('No such trial.');
  return trial;
}
