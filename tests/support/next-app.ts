import http from 'node:http';
import next from 'next';

/**
 * The real Next.js request handler of the built app (`next build` runs first in
 * `npm test`), wrapped in a Node HTTP server for supertest. Give `port` when
 * the server will listen on it (browser tests): Next.js then knows its own
 * address, e.g. to render a server action's redirect target in one round trip.
 */
export async function startNextHandler(opts: { port?: number } = {}): Promise<{ server: http.Server; close: () => Promise<void> }> {
  const app = next({ dev: false, dir: process.cwd(), hostname: 'localhost', quiet: true, ...(opts.port ? { port: opts.port } : {}) });
  await app.prepare();
  const handle = app.getRequestHandler();
  const server = http.createServer((req, res) => handle(req, res));
  return {
    server,
    close: async () => {
      await new Promise<void>((r) => server.close(() => r()));
      await app.close?.();
    },
  };
}
