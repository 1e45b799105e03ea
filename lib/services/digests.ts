import 'server-only';
import { createHash } from 'node:crypto';
import { QueryTypes, Transaction } from 'sequelize';
import { execWrite, sequelize } from '@/db';
import { OutboxMessage } from '@/db/models';

/** One event carried by a weekly digest (a snapshot of the row it replaces). */
export type DigestItem = { id: number; kind: string; feedstockId: number | null; subscriptionId: number | null; payload: Record<string, unknown>; at: string };

/** The payload of a 'weekly-digest' outbox row. */
export type DigestPayload = { periodStart: string; periodEnd: string; subscriptionIds: number[]; items: DigestItem[] };

/** The app_meta key holding when the scheduled digest last ran. */
export const DIGEST_CLOCK_KEY = 'mail.digest.last-run';

/**
 * The weekly digest job: every row waiting for a digest ('digest', written by
 * queueFeedstockEvent for digest-mode subscribers) up to `now` is grouped by
 * recipient into ONE new pending 'weekly-digest' row, and the grouped rows
 * are marked 'digested' with a pointer to it — in one transaction, so a row is
 * in exactly one digest. Rows of subscriptions stopped meanwhile are
 * cancelled instead. Rows are claimed with FOR UPDATE SKIP LOCKED, so two
 * runs at once never put a row in two digests. The outbox worker then sends
 * the digest mails like any other (with retries).
 */
export async function runWeeklyDigest(now: Date = new Date()): Promise<{ digests: number; items: number; cancelled: number }> {
  return sequelize.transaction({ isolationLevel: Transaction.ISOLATION_LEVELS.READ_COMMITTED }, async (transaction) => {
    const rows = await sequelize.query<{
      id: number | string;
      kind: string;
      recipient: string;
      feedstock_id: number | null;
      subscription_id: number | null;
      payload: string | Record<string, unknown>;
      created_at: Date;
      active: number | null;
    }>(
      `SELECT o.id, o.kind, o.recipient, o.feedstock_id, o.subscription_id, o.payload, o.created_at,
              (s.id IS NOT NULL AND s.confirmed_at IS NOT NULL AND s.unsubscribed_at IS NULL) AS active
       FROM outbox o LEFT JOIN subscriptions s ON s.id = o.subscription_id
       WHERE o.status = 'digest' AND o.created_at <= :now
       ORDER BY o.recipient, o.created_at, o.id
       FOR UPDATE SKIP LOCKED`,
      { replacements: { now }, type: QueryTypes.SELECT, transaction },
    );
    const stopped = rows.filter((r) => !Number(r.active)).map((r) => Number(r.id));
    if (stopped.length) {
      await execWrite(`UPDATE outbox SET status = 'cancelled', last_error = 'Unsubscribed before the digest.', updated_at = UTC_TIMESTAMP(3) WHERE id IN (?)`, {
        replacements: [stopped],
        transaction,
      });
    }
    const groups = new Map<string, typeof rows>();
    for (const r of rows) {
      if (!Number(r.active)) continue;
      const key = r.recipient.toLowerCase();
      groups.set(key, [...(groups.get(key) ?? []), r]);
    }
    let items = 0;
    for (const [recipient, list] of groups) {
      const payload: DigestPayload = {
        periodStart: new Date(Math.min(...list.map((r) => new Date(r.created_at).getTime()))).toISOString(),
        periodEnd: now.toISOString(),
        subscriptionIds: [...new Set(list.map((r) => r.subscription_id).filter((id): id is number => id !== null).map(Number))],
        items: list.map((r) => ({
          id: Number(r.id),
          kind: r.kind,
          feedstockId: r.feedstock_id === null ? null : Number(r.feedstock_id),
          subscriptionId: r.subscription_id === null ? null : Number(r.subscription_id),
          payload: typeof r.payload === 'string' ? (JSON.parse(r.payload) as Record<string, unknown>) : r.payload,
          at: new Date(r.created_at).toISOString(),
        })),
      };
      const digest = await OutboxMessage.create(
        {
          kind: 'weekly-digest',
          recipient: list[0].recipient,
          subscriptionId: null,
          feedstockId: null,
          payload: payload as unknown as Record<string, unknown>,
          // One digest per reader and run, whatever happens to this transaction's retries.
          dedupeKey: `weekly-digest:${createHash('sha256').update(recipient).digest('hex').slice(0, 32)}:${payload.items[0].id}-${payload.items[payload.items.length - 1].id}`,
          status: 'pending',
        },
        { transaction },
      );
      await execWrite(`UPDATE outbox SET status = 'digested', digest_id = ?, updated_at = UTC_TIMESTAMP(3) WHERE id IN (?)`, {
        replacements: [digest.id, list.map((r) => Number(r.id))],
        transaction,
      });
      items += list.length;
    }
    return { digests: groups.size, items, cancelled: stopped.length };
  });
}

/**
 * Runs the weekly digest when `everyHours` have passed since the last run,
 * for the worker's loop. The clock lives in MariaDB (app_meta) and is moved
 * with a compare-and-set, so with several workers exactly one runs it. The
 * first call only starts the clock. Returns the job's result, or null when it
 * was not yet time.
 */
export async function runScheduledDigest(now: Date, everyHours: number): Promise<Awaited<ReturnType<typeof runWeeklyDigest>> | null> {
  const stamp = now.toISOString();
  const inserted = await execWrite('INSERT IGNORE INTO app_meta (`key`, value, updated_at) VALUES (?, ?, UTC_TIMESTAMP(3))', { replacements: [DIGEST_CLOCK_KEY, stamp] });
  if (inserted) return null;
  const [row] = await sequelize.query<{ value: string }>('SELECT value FROM app_meta WHERE `key` = ?', { replacements: [DIGEST_CLOCK_KEY], type: QueryTypes.SELECT });
  const last = Date.parse(row?.value ?? '');
  if (Number.isFinite(last) && now.getTime() - last < everyHours * 3_600_000) return null;
  const won = await execWrite('UPDATE app_meta SET value = ?, updated_at = UTC_TIMESTAMP(3) WHERE `key` = ? AND value = ?', {
    replacements: [stamp, DIGEST_CLOCK_KEY, row?.value ?? ''],
  });
  return won ? runWeeklyDigest(now) : null;
}
