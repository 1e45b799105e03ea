/**
 * The client address for rate limits. Next.js fills `x-forwarded-for` with
 * the socket address when the request has none; a load balancer appends the
 * address it saw. The right-most entry is therefore the one added by the
 * nearest hop we trust (the balancer in production, Next.js locally). A
 * client talking to Next.js directly can put its own header in front, so
 * without a balancer the per-client limit is best effort — the per-address
 * limit still holds. Returns 'unknown' when nothing is there.
 */
export function clientIpFrom(headers: Headers): string {
  const forwarded = headers.get('x-forwarded-for');
  if (forwarded) {
    const parts = forwarded.split(',').map((s) => s.trim()).filter(Boolean);
    const last = parts[parts.length - 1];
    if (last) return normaliseIp(last);
  }
  const real = headers.get('x-real-ip');
  return real ? normaliseIp(real.trim()) : 'unknown';
}

/** "::ffff:127.0.0.1" → "127.0.0.1", so one client is one key. */
function normaliseIp(ip: string): string {
  return ip.startsWith('::ffff:') ? ip.slice(7) : ip;
}
