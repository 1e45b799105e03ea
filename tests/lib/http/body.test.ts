import { describe, expect, it } from 'vitest';
import { PayloadTooLargeError } from '@/lib/errors';
import { assertDeclaredLength, readJson, readLimited } from '@/lib/http/body';

const MB = 1024 * 1024;

/** A body of `total` bytes in 64 kB chunks that counts how many chunks were pulled. */
function countingStream(total: number) {
  const chunk = new Uint8Array(64 * 1024);
  let sent = 0;
  const stats = { pulled: 0, cancelled: false };
  const stream = new ReadableStream<Uint8Array>({
    pull(controller) {
      if (sent >= total) return controller.close();
      stats.pulled += 1;
      sent += chunk.length;
      controller.enqueue(chunk);
    },
    cancel() {
      stats.cancelled = true;
    },
  }, { highWaterMark: 0 });
  return { stream, stats };
}

describe('limited body reading', () => {
  it('stops a 12 MB body just past the 10 MB limit and cancels the rest (never buffered whole)', async () => {
    const { stream, stats } = countingStream(12 * MB);
    await expect(readLimited(stream, 10 * MB)).rejects.toBeInstanceOf(PayloadTooLargeError);
    expect(stats.cancelled).toBe(true);
    // 10 MB is 160 chunks of 64 kB; one more goes over the limit.
    expect(stats.pulled).toBe(161);
  });

  it('reads a body under the limit whole', async () => {
    const { stream } = countingStream(MB);
    expect((await readLimited(stream, 10 * MB)).length).toBe(MB);
  });

  it('refuses by Content-Length before reading', () => {
    const req = new Request('http://localhost/x', { method: 'POST', headers: { 'content-length': String(12 * MB) } });
    expect(() => assertDeclaredLength(req, 10 * MB)).toThrow(PayloadTooLargeError);
  });

  it('answers 400 for a body that is not JSON', async () => {
    const req = new Request('http://localhost/x', { method: 'POST', body: '{nope' });
    await expect(readJson(req)).rejects.toMatchObject({ status: 400 });
  });
});
