import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { chromium, type Browser } from 'playwright-core';
import next from 'next';

/** Debian's Chromium, headless, with a fresh profile and nothing phoning home. */
export async function launchChromium(): Promise<Browser> {
  return chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

/**
 * The built app (`next build` runs first in `npm test`) served on a free port
 * of 127.0.0.1 for a browser; `close()` stops it.
 */
export async function serveApp(): Promise<{ baseUrl: string; close: () => Promise<void> }> {
  const app = next({ dev: false, dir: process.cwd(), hostname: 'localhost', quiet: true });
  await app.prepare();
  const handle = app.getRequestHandler();
  const server = http.createServer((req, res) => handle(req, res));
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  return {
    baseUrl: `http://127.0.0.1:${port}`,
    close: async () => {
      server.closeAllConnections();
      await new Promise<void>((r) => server.close(() => r()));
      await app.close?.();
    },
  };
}
