/**
 * Next.js page cache handler (next.config.mjs `cacheHandler`): Next's own
 * file-system and in-memory cache, with one change — a page's HTML is stored
 * as ASCII (lib/http/ascii-html.mjs), the same document in escaped form.
 *
 * Cached pages are sent as JavaScript strings. Node copies an ASCII string
 * straight into the socket, but transcodes one holding any other character
 * (a "²", an en dash) to UTF-8 on every response, and V8 keeps a string with
 * any character above U+00FF at two bytes per character. On the demo's
 * heaviest feedstock page (197 KB) that is about 490 → 790 responses a
 * second on 2 cores.
 *
 * It extends Next's built-in handler class, which Next.js does not export as
 * public API: the `next` version is pinned, and tests/integration/page-cache.test.ts
 * fails if a Next upgrade moves or changes it.
 */
import { createRequire } from 'node:module';
import { asciiHtml } from './ascii-html.mjs';

const require = createRequire(import.meta.url);
const { default: FileSystemCache } = require('next/dist/server/lib/incremental-cache/file-system-cache');

/** Page entries whose HTML is already in ASCII form. */
const converted = new WeakSet();
const isPage = (value) => !!value && value.kind === 'APP_PAGE' && typeof value.html === 'string';

export default class AsciiPageCache extends FileSystemCache {
  /** A page read back (from memory or from a file written before) is converted once, then kept so. */
  async get(key, ctx) {
    const entry = await super.get(key, ctx);
    const value = entry && entry.value;
    if (isPage(value) && !converted.has(value)) {
      value.html = asciiHtml(value.html);
      converted.add(value);
    }
    return entry;
  }

  /** A freshly rendered page is stored (in memory and on disk) in ASCII form. */
  async set(key, data, ctx) {
    if (isPage(data)) {
      data = { ...data, html: asciiHtml(data.html) };
      converted.add(data);
    }
    return super.set(key, data, ctx);
  }
}
