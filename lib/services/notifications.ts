import 'server-only';
import { Op, type Transaction } from 'sequelize';
import { OutboxMessage, Subscription } from '@/db/models';

/** Kinds of feedstock events subscribers hear about. */
export type FeedstockEventKind = 'verdict-decided' | 'proposal-opened' | 'trial-linked' | 'page-edited';

/** Every outbox kind the mail templates know (lib/mail/templates.ts). */
export const OUTBOX_KINDS = ['verdict-decided', 'proposal-opened', 'trial-linked', 'page-edited', 'check-in-due', 'edit-rejected', 'weekly-digest'] as const;

/**
 * Writes one outbox row per confirmed subscriber of the feedstock (and of the
 * whole site) inside the caller's transaction, so mail exists exactly when the
 * change does. Digest subscribers get a row marked 'digest' for the weekly job.
 * Someone who follows both the feedstock and the whole site gets one row, under
 * the feedstock's subscription (its mode wins). `eventId` makes the rows
 * idempotent: the same event never queues twice (unique dedupe key).
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
  // One mail per address: the feedstock's own subscription before a whole-site one.
  const byEmail = new Map<string, Subscription>();
  for (const s of subs) {
    const key = s.email.toLowerCase();
    const held = byEmail.get(key);
    if (!held || (held.feedstockId === null && s.feedstockId !== null)) byEmail.set(key, s);
  }
  const chosen = [...byEmail.values()];
  await OutboxMessage.bulkCreate(
    chosen.map((s) => ({
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
  return chosen.length;
}
