import 'server-only';
import { createHash } from 'node:crypto';
import { Op, QueryTypes } from 'sequelize';
import { sequelize } from '@/db';
import { RateLimit } from '@/db/models';
import { RateLimitedError } from '@/lib/errors';

/** A limit: at most `max` hits per `windowSeconds` (fixed window, shared through MariaDB). */
export type Limit = { max: number; windowSeconds: number };

/**
 * Sign-in mail limits. Per address: enough for a typo and a retry, not for
 * flooding someone's inbox. Per client: a household or a school behind one
 * address can still sign several people in.
 */
export const SIGN_IN_MAIL_LIMITS = {
  perAddress: { max: 5, windowSeconds: 60 * 60 },
  perClient: { max: 20, windowSeconds: 60 * 60 },
} as const satisfies Record<string, Limit>;

/** The outcome of one counted hit. */
export type HitResult = { allowed: boolean; hits: number; retryAfterSeconds: number };

const hash = (s: string) => createHash('sha256').update(s).digest('hex').slice(0, 40);

/**
 * Counts one hit on `bucket` and says whether it is within `limit`. One
 * atomic upsert on the database clock, so several app servers share the
 * count and never race: the window restarts when the stored one has ended.
 */
export async function hitRateLimit(bucket: string, limit: Limit): Promise<HitResult> {
  return sequelize.transaction(async (transaction) => {
    await sequelize.query(
      `INSERT INTO rate_limits (bucket, window_start, hits, expires_at)
       VALUES (:bucket, UTC_TIMESTAMP(3), 1, UTC_TIMESTAMP(3) + INTERVAL :window SECOND)
       ON DUPLICATE KEY UPDATE
         hits = IF(expires_at <= UTC_TIMESTAMP(3), 1, hits + 1),
         window_start = IF(expires_at <= UTC_TIMESTAMP(3), UTC_TIMESTAMP(3), window_start),
         expires_at = IF(expires_at <= UTC_TIMESTAMP(3), UTC_TIMESTAMP(3) + INTERVAL :window SECOND, expires_at)`,
      { replacements: { bucket, window: limit.windowSeconds }, transaction },
    );
    const [row] = await sequelize.query<{ hits: number; retry: number }>(
      `SELECT hits, GREATEST(1, CEIL(TIMESTAMPDIFF(MICROSECOND, UTC_TIMESTAMP(3), expires_at) / 1000000)) AS retry
       FROM rate_limits WHERE bucket = :bucket`,
      { replacements: { bucket }, type: QueryTypes.SELECT, transaction },
    );
    const hits = Number(row.hits);
    return { allowed: hits <= limit.max, hits, retryAfterSeconds: Number(row.retry) };
  });
}

const minutes = (s: number) => {
  const m = Math.max(1, Math.ceil(s / 60));
  return m === 1 ? 'a minute' : `${m} minutes`;
};

/**
 * Counts one sign-in mail for the address and the client, and throws
 * RateLimitedError (429, with Retry-After) when either is over its limit.
 * Addresses and client addresses are stored only as hashes.
 */
export async function enforceSignInMailLimits({ email, clientIp }: { email: string; clientIp: string }): Promise<void> {
  const address = await hitRateLimit(`signin-mail:address:${hash(email)}`, SIGN_IN_MAIL_LIMITS.perAddress);
  if (!address.allowed) {
    throw new RateLimitedError(
      `Too many sign-in e-mails for this address. Use the newest link we sent, or try again in ${minutes(address.retryAfterSeconds)}.`,
      address.retryAfterSeconds,
    );
  }
  const client = await hitRateLimit(`signin-mail:client:${hash(clientIp)}`, SIGN_IN_MAIL_LIMITS.perClient);
  if (!client.allowed) {
    throw new RateLimitedError(
      `Too many sign-in e-mails from your network. Try again in ${minutes(client.retryAfterSeconds)}.`,
      client.retryAfterSeconds,
    );
  }
  // Expired counters are of no use; clear a few now and then.
  if (Math.random() < 0.02) await RateLimit.destroy({ where: { expiresAt: { [Op.lt]: new Date() } }, limit: 500 });
}

/**
 * Confirmation mail for visitors who follow a feedstock by e-mail: a few per
 * address (nobody's inbox can be flooded by strangers), more per client.
 */
export const SUBSCRIBE_MAIL_LIMITS = {
  perAddress: { max: 5, windowSeconds: 60 * 60 },
  perClient: { max: 30, windowSeconds: 60 * 60 },
} as const satisfies Record<string, Limit>;

/** Counts one confirmation mail for the address and the client; throws RateLimitedError (429) over either limit. */
export async function enforceSubscribeMailLimits({ email, clientIp }: { email: string; clientIp: string }): Promise<void> {
  const address = await hitRateLimit(`subscribe-mail:address:${hash(email)}`, SUBSCRIBE_MAIL_LIMITS.perAddress);
  if (!address.allowed) {
    throw new RateLimitedError(
      `We already sent several confirmation links to this address. Use the newest one, or try again in ${minutes(address.retryAfterSeconds)}.`,
      address.retryAfterSeconds,
    );
  }
  const client = await hitRateLimit(`subscribe-mail:client:${hash(clientIp)}`, SUBSCRIBE_MAIL_LIMITS.perClient);
  if (!client.allowed) {
    throw new RateLimitedError(`Too many subscription requests from your network. Try again in ${minutes(client.retryAfterSeconds)}.`, client.retryAfterSeconds);
  }
}
