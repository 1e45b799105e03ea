import http from 'node:http';

/**
 * Sends a request with a body of `bytes` and resolves with the status and body
 * of the response, even when the server answers (and stops reading) before
 * the body is fully sent — as it should for an oversized upload.
 */
export function sendRaw(port: number, opts: { method: string; path: string; headers?: Record<string, string>; body: Buffer }): Promise<{ status: number; body: string; sentAll: boolean }> {
  return new Promise((resolve, reject) => {
    let sentAll = false;
    let answered = false;
    const req = http.request({ host: '127.0.0.1', port, method: opts.method, path: opts.path, headers: { 'content-length': String(opts.body.length), ...opts.headers } }, (res) => {
      answered = true;
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body: Buffer.concat(chunks).toString('utf8'), sentAll }));
      res.on('error', reject);
    });
    // EPIPE/ECONNRESET while still sending is expected when the server refuses early; the answer may follow.
    req.on('error', (err) => setTimeout(() => (answered ? undefined : reject(err)), 500));
    req.end(opts.body, () => {
      sentAll = true;
    });
  });
}
