import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';

/**
 * Calls server actions of the BUILT app over HTTP, the way the browser's
 * router does: POST to a page with the `Next-Action` header and the
 * arguments encoded by React's own `encodeReply`. So a test goes through
 * Next.js's Origin check, the session cookie, the action and the service.
 */

const require = createRequire(path.join(process.cwd(), 'package.json'));
// The same Flight client that Next.js ships; encodeReply turns [state, FormData] into the wire format.
const flight = require('next/dist/compiled/react-server-dom-webpack/client.node.js') as {
  encodeReply: (value: unknown) => Promise<FormData | string>;
};

type ManifestEntry = { workers: Record<string, unknown>; filename?: string; exportedName?: string };

/** A server action found in the build: where it lives and a page that can run it. */
export type BuiltAction = { id: string; file: string; name: string; pagePath: string };

/** Every server action in `.next/server/server-reference-manifest.json`, keyed "file#export". */
export function loadBuiltActions(): Map<string, BuiltAction> {
  const manifest = JSON.parse(readFileSync(path.join(process.cwd(), '.next/server/server-reference-manifest.json'), 'utf8')) as {
    node: Record<string, ManifestEntry>;
  };
  const out = new Map<string, BuiltAction>();
  for (const [id, entry] of Object.entries(manifest.node)) {
    if (!entry.filename || !entry.exportedName) continue;
    // A page without dynamic segments that bundles the action, e.g. app/account/page → /account.
    // Prefer a static page; an action used only on dynamic pages is called
    // through one of them with a demo feedstock's slug (or id 1) filled in.
    const pages = Object.keys(entry.workers).filter((w) => w.endsWith('/page'));
    const worker = pages.filter((w) => !w.includes('[')).sort((a, b) => a.length - b.length)[0] ?? pages.sort((a, b) => a.length - b.length)[0];
    if (!worker) continue;
    const pagePath =
      worker
        .replace(/^app/, '')
        .replace(/\/page$/, '')
        .replace(/\/\([^)]+\)/g, '')
        .replace(/\[slug\]/g, 'banana-peel')
        .replace(/\[[^\]]+\]/g, '1') || '/';
    out.set(`${entry.filename}#${entry.exportedName}`, { id, file: entry.filename, name: entry.exportedName, pagePath });
  }
  return out;
}

/** What an action call came back with. */
export type ActionCall = {
  status: number;
  /** Where the action redirected to (`redirect()`), if it did. */
  redirect: string | null;
  /** The returned value (e.g. an ActionState), when the response carried one. */
  result: unknown;
  setCookie: string[];
};

/** Invokes `action` with `(prevState, formData)` as a browser form would. */
export async function callServerAction(
  baseUrl: string,
  action: BuiltAction,
  fields: Record<string, string>,
  { cookie, origin = baseUrl, prevState = { ok: false } }: { cookie?: string; origin?: string | null; prevState?: unknown } = {},
): Promise<ActionCall> {
  const formData = new FormData();
  for (const [k, v] of Object.entries(fields)) formData.append(k, v);
  const body = await flight.encodeReply([prevState, formData]);
  const headers: Record<string, string> = { 'Next-Action': action.id, Accept: 'text/x-component' };
  if (origin) headers.Origin = origin;
  if (cookie) headers.Cookie = cookie;
  const res = await fetch(new URL(action.pagePath, baseUrl), { method: 'POST', headers, body, redirect: 'manual' });
  const text = await res.text();
  const redirect = res.headers.get('x-action-redirect');
  return { status: res.status, redirect: redirect ? redirect.split(';')[0] : null, result: readActionResult(text), setCookie: res.headers.getSetCookie() };
}

/** Picks the action's return value out of the Flight response (row 0 points at it: {"a":"$@<row>"}). */
function readActionResult(text: string): unknown {
  const rows = new Map<string, string>();
  for (const line of text.split('\n')) {
    const m = line.match(/^([0-9a-f]+):(.*)$/);
    if (m) rows.set(m[1], m[2]);
  }
  try {
    const root = JSON.parse(rows.get('0') ?? 'null') as { a?: unknown } | null;
    const ref = typeof root?.a === 'string' ? root.a : null;
    if (!ref) return root?.a;
    const row = ref.startsWith('$@') ? rows.get(ref.slice(2)) : null;
    if (!row) return undefined;
    if (row.startsWith('E')) return { error: JSON.parse(row.slice(1)) };
    return JSON.parse(row);
  } catch {
    return undefined;
  }
}
