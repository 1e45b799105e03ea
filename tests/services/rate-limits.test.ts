import { randomUUID } from 'node:crypto';
import { afterAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { RateLimit } from '@/db/models';
import { RateLimitedError } from '@/lib/errors';
import { enforceSignInMailLimits, hitRateLimit, SIGN_IN_MAIL_LIMITS } from '@/lib/services/rate-limits';

// Fixed-window counters in MariaDB, shared by every app server.
describe('rate limits', () => {
  const buckets: string[] = [];
  const bucket = () => {
    const b = `test:${randomUUID()}`;
    buckets.push(b);
    return b;
  };
  afterAll(async () => {
    await RateLimit.destroy({ where: { bucket: buckets } });
    await sequelize.close();
  });

  it('allows up to the limit in a window, then refuses with a Retry-After inside the window', async () => {
    const b = bucket();
    const limit = { max: 3, windowSeconds: 600 };
    const results = [];
    for (let i = 0; i < 5; i++) results.push(await hitRateLimit(b, limit));
    expect(results.map((r) => r.allowed)).toEqual([true, true, true, false, false]);
    expect(results.map((r) => r.hits)).toEqual([1, 2, 3, 4, 5]);
    for (const r of results) {
      expect(r.retryAfterSeconds).toBeGreaterThan(590);
      expect(r.retryAfterSeconds).toBeLessThanOrEqual(600);
    }
  });

  it('starts a new window once the old one has ended', async () => {
    const b = bucket();
    const limit = { max: 1, windowSeconds: 1 };
    expect((await hitRateLimit(b, limit)).allowed).toBe(true);
    expect((await hitRateLimit(b, limit)).allowed).toBe(false);
    await new Promise((r) => setTimeout(r, 1_100));
    const fresh = await hitRateLimit(b, limit);
    expect(fresh).toMatchObject({ allowed: true, hits: 1 });
  });

  it('counts concurrent hits exactly (one atomic upsert each)', async () => {
    const b = bucket();
    const results = await Promise.all(Array.from({ length: 24 }, () => hitRateLimit(b, { max: 10, windowSeconds: 600 })));
    expect(results.map((r) => r.hits).sort((x, y) => x - y)).toEqual(Array.from({ length: 24 }, (_, i) => i + 1));
    expect(results.filter((r) => r.allowed)).toHaveLength(10);
  });

  it('sign-in mail: per address, then per client, with messages a person understands', async () => {
    const email = `svc-${randomUUID()}@example.test`;
    const ip = `192.0.2.${Math.floor(Math.random() * 250) + 1}`;
    for (let i = 0; i < SIGN_IN_MAIL_LIMITS.perAddress.max; i++) await enforceSignInMailLimits({ email, clientIp: ip });
    const err = await enforceSignInMailLimits({ email, clientIp: ip }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(RateLimitedError);
    expect((err as RateLimitedError).status).toBe(429);
    expect((err as RateLimitedError).message).toMatch(/for this address/);
    expect((err as RateLimitedError).retryAfterSeconds).toBeGreaterThan(0);
    await RateLimit.destroy({ where: {} });
  });
});
