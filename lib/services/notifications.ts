import 'server-only';
import { Op, type Transaction } from 'sequelize';
import { OutboxMessage, Subscription } from '@/db/models';

/** Kinds of feedstock events subscribers hear about. */
export type FeedstockEventKind = 'verdict-decided' | 'proposal-opened' | 'trial-linked' | 'page-edited';

/**
 * Writes one outbox row per confirmed subscriber of the feedstock (and of the
 * whole site) inside the caller's transaction, so mail exists exactly when the
 * change does. Digest subscribers get a row marked 'digest' for the weekly job.
 * `eventId` makes the rows idempotent: the same event never queues twice.
 */
export async function queueFeedstockEvent(
  transaction: Transaction,
  event: { kind: FeedstockEventKind; eventId: string; feedstockId: number; payload: Record<string, unknown> },
): Promise<number> {
  const subs = await Subscription.findAll({
    where: {
      [Op.or]: [{ feedstockId: event.feedstockId }, { feedstockId: null }],
      confirmedAt: { [Op.ne]: null },
      unsubscribedAt: null,
    },
    transaction,
  });
  if (!subs.length) return 0;
  await OutboxMessage.bulkCreate(
    subs.map((s) => ({
      kind: event.kind,
      recipient: s.email,
      subscriptionId: s.id,
      feedstockId: event.feedstockId,
      payload: event.payload,
      dedupeKey: `${event.kind}:${event.eventId}:${s.id}`,
      status: s.mode === 'digest' ? ('digest' as const) : ('pending' as const),
    })),
    { transaction, ignoreDuplicates: true },
  );
  return subs.length;
}
