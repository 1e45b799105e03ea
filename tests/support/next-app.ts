import http from 'node:http';
import next from 'next';
import { freePort } from '../../db/server/mariadb.mjs';

/**
 * The real Next.js request handler of the built app (`next build` runs first in
 * `npm test`), wrapped in a Node HTTP server for supertest. With `listen`, it
 * also listens on a free port of 127.0.0.1 (Next.js is told the port, so a
 * server action that redirects can fetch the next page from itself) and
 * `baseUrl` is its address.
 */
export async function startNextHandler({ listen = false, port: fixedPort }: { listen?: boolean; port?: number } = {}): Promise<{
  server: http.Server;
  baseUrl: string | null;
  close: () => Promise<void>;
}> {
  // `port`: the caller listens there itself (Next.js still needs to know its own address).
  const port = fixedPort ?? (listen ? await freePort() : undefined);
  const app = next({ dev: false, dir: process.cwd(), hostname: 'localhost', port, quiet: true });
  await app.prepare();
  const handle = app.getRequestHandler();
  const server = http.createServer((req, res) => handle(req, res));
  if (listen && port) await new Promise<void>((resolve, reject) => server.once('error', reject).listen(port, '127.0.0.1', () => resolve()));
  return {
    server,
    baseUrl: listen && port ? `http://127.0.0.1:${port}` : null,
    close: async () => {
      await new Promise<void>((r) => server.close(() => r()));
      await app.close?.();
    },
  };
}
