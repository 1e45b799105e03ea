import 'server-only';
import { QueryTypes, Transaction } from 'sequelize';
import { execWrite, sequelize } from '@/db';
import { OutboxMessage } from '@/db/models';

/**
 * The outbox's state machine, for the mail worker (lib/mail/outbox-worker.ts).
 * Rows are written by services in the same transaction as the change; here a
 * worker claims due rows under a lock, and marks each one sent, retried with
 * exponential backoff, failed or cancelled. Several workers can run at once:
 * claiming uses SELECT … FOR UPDATE SKIP LOCKED, and every later mark is
 * fenced by the attempt number the claim gave the row, so a worker whose lock
 * ran out can never overwrite the outcome of the worker that took over.
 */

/** A row the worker holds: its id and the attempt number its claim gave it (the fencing token). */
export type ClaimedMessage = { message: OutboxMessage; attempt: number };

/** The longest wait between two attempts. */
export const MAX_RETRY_DELAY_MS = 6 * 60 * 60 * 1000;

/**
 * Claims up to `limit` due rows: pending ones whose next attempt is due, and
 * 'sending' ones whose lock expired (their worker died mid-send). Each is set
 * to 'sending', locked for `lockMs` and its attempt counted, in one short
 * transaction; rows another worker holds are skipped, never waited for.
 */
export async function claimDueMessages({ limit = 20, lockMs = 5 * 60_000 }: { limit?: number; lockMs?: number } = {}): Promise<ClaimedMessage[]> {
  const ids = await sequelize.transaction({ isolationLevel: Transaction.ISOLATION_LEVELS.READ_COMMITTED }, async (transaction) => {
    // Two index-ordered scans rather than one OR: with a sort, FOR UPDATE would lock every
    // candidate row it read, and a second worker would find them all skipped.
    const due = await sequelize.query<{ id: number | string }>(
      `SELECT id FROM outbox FORCE INDEX (outbox_due)
       WHERE status = 'pending' AND next_attempt_at <= UTC_TIMESTAMP(3)
       ORDER BY status, next_attempt_at, id
       LIMIT :limit
       FOR UPDATE SKIP LOCKED`,
      { replacements: { limit }, type: QueryTypes.SELECT, transaction },
    );
    const stale =
      due.length < limit
        ? await sequelize.query<{ id: number | string }>(
            `SELECT id FROM outbox FORCE INDEX (outbox_due)
             WHERE status = 'sending' AND locked_until < UTC_TIMESTAMP(3)
             LIMIT :limit
             FOR UPDATE SKIP LOCKED`,
            { replacements: { limit: limit - due.length }, type: QueryTypes.SELECT, transaction },
          )
        : [];
    const rows = [...due, ...stale];
    const found = rows.map((r) => Number(r.id));
    if (!found.length) return [];
    await sequelize.query(
      `UPDATE outbox SET status = 'sending', attempts = attempts + 1,
         locked_until = UTC_TIMESTAMP(3) + INTERVAL :lockUs MICROSECOND, updated_at = UTC_TIMESTAMP(3)
       WHERE id IN (:ids)`,
      { replacements: { ids: found, lockUs: Math.round(lockMs * 1000) }, transaction },
    );
    return found;
  });
  if (!ids.length) return [];
  const messages = await OutboxMessage.findAll({ where: { id: ids }, order: [['id', 'ASC']] });
  return messages.map((message) => ({ message, attempt: message.attempts }));
}

/** Marks a claimed row sent, once. False when the claim was lost (the lock expired and another worker took the row). */
export async function markSent({ message, attempt }: ClaimedMessage): Promise<boolean> {
  const n = await execWrite(
    `UPDATE outbox SET status = 'sent', sent_at = UTC_TIMESTAMP(3), locked_until = NULL, last_error = NULL, updated_at = UTC_TIMESTAMP(3)
     WHERE id = ? AND status = 'sending' AND attempts = ?`,
    { replacements: [message.id, attempt] },
  );
  return n === 1;
}

/** The wait before attempt `attempt + 1`: base × 2^(attempt − 1), capped at MAX_RETRY_DELAY_MS, plus up to 10 % jitter. */
export function retryDelayMs(attempt: number, baseMs: number, random: () => number = Math.random): number {
  const exp = Math.min(MAX_RETRY_DELAY_MS, baseMs * 2 ** Math.max(0, attempt - 1));
  return Math.round(Math.min(MAX_RETRY_DELAY_MS, exp * (1 + 0.1 * random())));
}

/**
 * Records a failed attempt: back to 'pending' with the next attempt after an
 * exponential delay, or 'failed' for good when `permanent` (the server refused
 * the recipient) or after `maxAttempts`. Returns the row's new status, or
 * null when the claim was lost.
 */
export async function markAttemptFailed(
  { message, attempt }: ClaimedMessage,
  error: string,
  { maxAttempts, retryBaseMs, permanent = false }: { maxAttempts: number; retryBaseMs: number; permanent?: boolean },
): Promise<'pending' | 'failed' | null> {
  const giveUp = permanent || attempt >= maxAttempts;
  const n = await execWrite(
    `UPDATE outbox SET status = ?, next_attempt_at = UTC_TIMESTAMP(3) + INTERVAL ? MICROSECOND,
       locked_until = NULL, last_error = ?, updated_at = UTC_TIMESTAMP(3)
     WHERE id = ? AND status = 'sending' AND attempts = ?`,
    { replacements: [giveUp ? 'failed' : 'pending', giveUp ? 0 : retryDelayMs(attempt, retryBaseMs) * 1000, error.slice(0, 2_000), message.id, attempt] },
  );
  return n === 1 ? (giveUp ? 'failed' : 'pending') : null;
}

/** Cancels a claimed row that must not go out (its reader unsubscribed meanwhile). */
export async function markCancelled({ message, attempt }: ClaimedMessage, reason: string): Promise<void> {
  await execWrite(
    `UPDATE outbox SET status = 'cancelled', locked_until = NULL, last_error = ?, updated_at = UTC_TIMESTAMP(3)
     WHERE id = ? AND status = 'sending' AND attempts = ?`,
    { replacements: [reason, message.id, attempt] },
  );
}

/** Counts of rows by status, and when the next pending one is due (for the worker's idle wait and for tests). */
export async function getOutboxState(): Promise<{ byStatus: Record<string, number>; nextDueInMs: number | null }> {
  const rows = await sequelize.query<{ status: string; n: number }>('SELECT status, COUNT(*) AS n FROM outbox GROUP BY status', { type: QueryTypes.SELECT });
  const [next] = await sequelize.query<{ ms: number | null }>(
    `SELECT TIMESTAMPDIFF(MICROSECOND, UTC_TIMESTAMP(3), MIN(LEAST(
        IF(status = 'pending', next_attempt_at, '9999-12-31'),
        IF(status = 'sending', locked_until, '9999-12-31')))) / 1000 AS ms
     FROM outbox WHERE status IN ('pending', 'sending')`,
    { type: QueryTypes.SELECT },
  );
  return {
    byStatus: Object.fromEntries(rows.map((r) => [r.status, Number(r.n)])),
    nextDueInMs: next?.ms === null || next?.ms === undefined ? null : Math.max(0, Number(next.ms)),
  };
}
