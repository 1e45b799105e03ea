import 'server-only';
import { Op } from 'sequelize';
import { OutboxMessage, User } from '@/db/models';
import { listDueCheckIns } from '@/lib/queries/trials';

/** Outbox kind of a check-in reminder (the mail worker renders it). */
export const CHECK_IN_DUE_KIND = 'check-in-due';

/** The dedupe key of a reminder: one per trial and due date, so it is queued once. */
export function checkInDueKey(trialId: number, dueDate: string): string {
  return `${CHECK_IN_DUE_KIND}:${trialId}:${dueDate}`;
}

/**
 * Queues a reminder mail in the outbox for every running trial whose next
 * check-in (start + k × schedule, after the last check-in) is due by `now`
 * (UTC date). Each trial and due date is queued once (dedupe key
 * `check-in-due:<trialId>:<dueDate>`, unique in the table), so the job can run
 * as often as wanted. Owners without an e-mail address or with a disabled
 * account get none. Returns how many were due and how many were newly queued.
 */
export async function queueDueCheckInReminders(now = new Date()): Promise<{ due: number; queued: number }> {
  const due = await listDueCheckIns(now);
  if (!due.length) return { due: 0, queued: 0 };
  const owners = await User.findAll({
    where: { id: { [Op.in]: [...new Set(due.map((d) => d.ownerId))] } },
    attributes: ['id', 'email', 'disabledAt'],
  });
  const byId = new Map(owners.map((o) => [o.id, o]));
  const rows = due.flatMap((d) => {
    const owner = byId.get(d.ownerId);
    if (!owner?.email || owner.disabledAt) return [];
    return [
      {
        kind: CHECK_IN_DUE_KIND,
        recipient: owner.email,
        subscriptionId: null,
        feedstockId: d.feedstockId,
        dedupeKey: checkInDueKey(d.trialId, d.due),
        payload: {
          trialId: d.trialId,
          path: `/trials/${d.trialId}`,
          dueDate: d.due,
          lastCheckIn: d.lastCheckIn,
          checkInEveryDays: d.checkInEveryDays,
          feedstockName: d.feedstockName,
          feedstockSlug: d.feedstockSlug,
          setting: d.setting,
          preparation: d.preparation,
        },
      },
    ];
  });
  if (!rows.length) return { due: due.length, queued: 0 };
  const existing = await OutboxMessage.findAll({ where: { dedupeKey: { [Op.in]: rows.map((r) => r.dedupeKey) } }, attributes: ['dedupeKey'] });
  const seen = new Set(existing.map((e) => e.dedupeKey));
  const fresh = rows.filter((r) => !seen.has(r.dedupeKey));
  // INSERT IGNORE: a concurrent run that queued the same key first wins, nothing is doubled.
  if (fresh.length) await OutboxMessage.bulkCreate(fresh, { ignoreDuplicates: true });
  return { due: due.length, queued: fresh.length };
}
