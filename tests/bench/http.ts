/**
 * HTTP benchmark of the wiki: search API and feedstock page latency (p50,
 * p95) and throughput on loopback, next to a static file of the same size
 * and an empty JSON route served by the same `next start`, with 2,000
 * feedstocks in the database. Not a test: it prints figures and ratios
 * against the targets and never fails on a missed target.
 *
 *   npx next build    # first: it benchmarks the built app
 *   node --conditions=react-server --import tsx tests/bench/http.ts
 *
 * It starts a throwaway MariaDB on a free port (data in a temp directory),
 * migrates it, loads the demo scenario and generates feedstocks up to 2,000,
 * starts `next start` on another free port of 127.0.0.1 against it, runs
 * autocannon, then stops both and removes the data. Settings (environment):
 *   BENCH_CONNECTIONS (20), BENCH_DURATION seconds per run (6), BENCH_WARMUP
 *   seconds of unrecorded load before each run (2), BENCH_CPU_PROFILE a
 *   directory for the server's V8 CPU profile,
 *   BENCH_FEEDSTOCKS total feedstocks (2000).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import os from 'node:os';
import path from 'node:path';
import { ensureDatabase, freePort, startMariaDB } from '../../db/server/mariadb.mjs';

type AutocannonResult = { requests: { average: number; total: number }; non2xx: number; errors: number; timeouts: number; throughput: { average: number } };
type AutocannonInstance = { on(event: 'response', fn: (client: unknown, status: number, bytes: number, ms: number) => void): void };
type Autocannon = (opts: Record<string, unknown>, cb: (err: Error | null, res: AutocannonResult) => void) => AutocannonInstance;
const autocannon = createRequire(import.meta.url)('autocannon') as Autocannon;

const ROOT = process.cwd();
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 20);
const DURATION = Number(process.env.BENCH_DURATION ?? 6);
const WARMUP = Number(process.env.BENCH_WARMUP ?? 2);
const TOTAL_FEEDSTOCKS = Number(process.env.BENCH_FEEDSTOCKS ?? 2000);
const log = (s: string) => console.log(`[bench] ${s}`);

// Queries as people type them (the same style as tests/lib/search-quality.test.ts).
const QUERIES = [
  'can worms eat orange peels?', 'are coffee grounds ok for worms', 'onion skin worm bin', 'can I put bread in my worm bin',
  'is it safe to feed worms garlic?', 'should I add eggshells to the wormery', 'do worms like banana skins', 'can red wigglers eat tomatoes',
  'what about cooked rice?', 'how much cardboard can I add', 'is horse manure good for worms', 'Can my worms handle chillies?',
  'tea bags', 'grass clippings', 'dog poo', 'apple core', 'broccoli stem', 'potatoes', 'fish scrap', 'egg carton', 'melon rinds',
  'corncobs', 'bananna peel', 'cofee grounds', 'cardbord', 'potatoe peelings', 'pumkin', 'avacado skins', 'brocoli', 'sawdst',
  'citrus', 'lime peel', 'chicken poop', 'cow pats', 'kitty litter', 'zucchini', 'moldy cheese', 'lawn cuttings', 'magazines', 'wood chips',
];

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return NaN;
  const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[i];
}

interface RunResult {
  name: string;
  connections: number;
  rps: number;
  p50: number;
  p95: number;
  p99: number;
  total: number;
  bad: number;
}

/** One autocannon run; latencies are collected per response so p95 is exact. */
function run(name: string, base: string, paths: string[] | (() => string), connections = CONNECTIONS, duration: number = DURATION): Promise<RunResult> {
  return new Promise((resolve, reject) => {
    const samples: number[] = [];
    let i = 0;
    const next = typeof paths === 'function' ? paths : () => paths[i++ % paths.length];
    const instance = autocannon(
      {
        url: base,
        connections,
        duration,
        pipelining: 1,
        requests: [{ method: 'GET', setupRequest: (req: { path: string }) => ({ ...req, path: next() }) }],
      },
      (err, res) => {
        if (err) return reject(err);
        samples.sort((a, b) => a - b);
        resolve({
          name,
          connections,
          rps: res.requests.average,
          p50: percentile(samples, 50),
          p95: percentile(samples, 95),
          p99: percentile(samples, 99),
          total: res.requests.total,
          bad: res.non2xx + res.errors + res.timeouts,
        });
      },
    );
    instance.on('response', (_c, _s, _b, ms) => samples.push(ms));
  });
}

// ---------------------------------------------------------------- data

/** Deterministic PRNG (mulberry32). */
function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const BASES = [
  'beet', 'turnip', 'parsnip', 'radish', 'leek', 'kale', 'chard', 'spinach', 'lettuce', 'cucumber', 'courgette', 'aubergine', 'pepper', 'pea',
  'bean', 'lentil', 'chickpea', 'barley', 'rye', 'millet', 'quinoa', 'buckwheat', 'pear', 'plum', 'cherry', 'apricot', 'peach', 'grape',
  'mango', 'papaya', 'pineapple', 'kiwi', 'fig', 'date', 'lychee', 'guava', 'quince', 'rhubarb', 'celery', 'fennel', 'artichoke',
  'asparagus', 'okra', 'yam', 'cassava', 'taro', 'ginger', 'turmeric', 'hemp', 'flax', 'jute', 'sisal', 'bracken', 'nettle', 'comfrey',
  'clover', 'alfalfa', 'vetch', 'sorghum', 'hops',
];
const PARTS = ['tops', 'peel', 'stalks', 'husks', 'pulp', 'leaves', 'cores', 'ends', 'trimmings', 'hulls', 'seeds', 'pods', 'mash', 'straw', 'skins', 'roots', 'chaff', 'bran', 'pomace', 'shells'];
const KINDS = ['', 'aged ', 'dried ', 'wilted ', 'cooked ', 'frozen '];
const CATS = ['fruit', 'vegetable', 'grain-starch', 'garden', 'other'] as const;
const VERDICT_CODES = ['feed', 'limit', 'prepare', 'avoid', 'unsettled'] as const;

/** Fills the database up to `total` feedstocks, each with two aliases and published verdicts. */
async function generateFeedstocks(total: number) {
  const { Feedstock, FeedstockAlias, FeedstockRevision, PublishedVerdict } = await import('@/db/models');
  const existing = await Feedstock.count();
  const r = rng(20261202);
  const names = new Set((await Feedstock.findAll({ attributes: ['name'] })).map((f) => f.name.toLowerCase()));
  const aliasesTaken = new Set((await FeedstockAlias.findAll({ attributes: ['alias'] })).map((a) => a.alias));
  const rows: { name: string; slug: string; category: (typeof CATS)[number]; family: string; aliases: string[] }[] = [];
  let guard = 0;
  while (existing + rows.length < total && guard++ < total * 50) {
    const base = BASES[Math.floor(r() * BASES.length)];
    const part = PARTS[Math.floor(r() * PARTS.length)];
    const kind = KINDS[Math.floor(r() * KINDS.length)];
    const name = `${kind}${base} ${part}`.replace(/^./, (c) => c.toUpperCase());
    if (names.has(name.toLowerCase())) continue;
    names.add(name.toLowerCase());
    const slug = name.toLowerCase().replace(/[^a-z0-9]+/g, '-');
    const aliases = [`${base} ${part} bench ${rows.length}`, `${kind}${part} of ${base}`.trim()].filter((a) => !aliasesTaken.has(a));
    aliases.forEach((a) => aliasesTaken.add(a));
    rows.push({ name, slug, category: CATS[Math.floor(r() * CATS.length)], family: base, aliases });
  }
  const created = await Feedstock.bulkCreate(
    rows.map((x) => ({
      slug: x.slug,
      name: x.name,
      category: x.category,
      family: x.family,
      cnRatio: 15 + Math.round(r() * 40),
      nitrogenPct: 1 + Math.round(r() * 20) / 10,
      moisturePct: 50 + Math.round(r() * 40),
      bulkDensityKgM3: 200 + Math.round(r() * 500),
      referenceSource: 'generated for the benchmark',
      summary: `Generated feedstock for the benchmark: ${x.name.toLowerCase()}.`,
      pageText: `${x.name} is a generated feedstock.\n\nIt exists so the search index and the index page hold 2,000 feedstocks.`,
      handlingCautions: [],
    })),
  );
  const byName = new Map(created.map((f) => [f.name, f.id]));
  await FeedstockAlias.bulkCreate(rows.flatMap((x) => x.aliases.map((alias) => ({ feedstockId: byName.get(x.name)!, alias }))));
  await FeedstockRevision.bulkCreate(
    created.map((f) => ({ feedstockId: f.id, authorId: null, body: f.pageText, editSummary: 'First version', status: 'published' as const, baseVersion: 0 })),
  );
  const now = new Date();
  await PublishedVerdict.bulkCreate(
    created.flatMap((f) =>
      (['bin', 'flow-through', 'bed'] as const)
        .filter(() => r() < 0.6)
        .map((setting) => ({ feedstockId: f.id, setting, verdict: VERDICT_CODES[Math.floor(r() * VERDICT_CODES.length)], ceilingKgM2: r() < 0.5 ? Math.round(r() * 80) / 10 : null, cautions: [], proposalId: null, publishedAt: now })),
    ),
  );
  return { existing, added: created.length, slugs: created.map((f) => f.slug) };
}

// ---------------------------------------------------------------- processes

function startNext(port: number, env: NodeJS.ProcessEnv): ChildProcess {
  // Own process group so the whole `next start` tree stops together.
  // BENCH_CPU_PROFILE=<dir>: the server writes a V8 CPU profile there when it stops (open it in Chrome DevTools).
  const prof = process.env.BENCH_CPU_PROFILE;
  const args = ['start', '-H', '127.0.0.1', '-p', String(port)];
  const child = spawn(process.execPath, [...(prof ? ['--cpu-prof', `--cpu-prof-dir=${path.resolve(prof)}`] : []), path.join(ROOT, 'node_modules', 'next', 'dist', 'bin', 'next'), ...args], {
    cwd: ROOT,
    env,
    detached: true,
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  return child;
}

async function stopGroup(child: ChildProcess | null) {
  if (!child || child.exitCode !== null) return;
  const exited = new Promise((r) => child.once('exit', r));
  try {
    process.kill(-child.pid!, 'SIGTERM');
  } catch {
    return;
  }
  const t = setTimeout(() => {
    try {
      process.kill(-child.pid!, 'SIGKILL');
    } catch {}
  }, 10_000);
  await exited;
  clearTimeout(t);
}

async function waitFor(url: string, ms = 60_000) {
  const deadline = Date.now() + ms;
  while (Date.now() < deadline) {
    try {
      const r = await fetch(url);
      if (r.ok) return;
    } catch {}
    await sleep(200);
  }
  throw new Error(`${url} did not answer within ${ms / 1000} s`);
}

// ---------------------------------------------------------------- main

async function main() {
  try {
    statSync(path.join(ROOT, '.next', 'BUILD_ID'));
  } catch {
    throw new Error('no build found: run `npx next build` first');
  }
  const dir = mkdtempSync(path.join(os.tmpdir(), 'trialbed-bench-'));
  const staticName = `bench-static-${process.pid}.html`;
  const staticFile = path.join(ROOT, 'public', staticName);
  let db: Awaited<ReturnType<typeof startMariaDB>> | null = null;
  let next: ChildProcess | null = null;
  try {
    const dbPort = await freePort();
    db = await startMariaDB({ dataDir: dir, port: dbPort, log });
    const dbEnv = { DB_HOST: '127.0.0.1', DB_PORT: String(dbPort), DB_NAME: 'trialbed_bench', DB_USER: 'bench', DB_PASSWORD: 'bench-pw' };
    ensureDatabase(db, { name: dbEnv.DB_NAME, user: dbEnv.DB_USER, password: dbEnv.DB_PASSWORD });
    Object.assign(process.env, dbEnv);

    const { sequelize } = await import('@/db');
    const { createMigrator } = await import('@/db/migrator');
    await createMigrator(sequelize).up();
    const { loadDemoScenario } = await import('@/db/seeders/load-demo');
    await loadDemoScenario();
    const gen = await generateFeedstocks(TOTAL_FEEDSTOCKS);
    log(`database: ${gen.existing} demo + ${gen.added} generated = ${gen.existing + gen.added} feedstocks`);
    await sequelize.close();

    // A static file the size of the feedstock page is needed before the server starts (it lists public/ at start),
    // so measure the page with a first server, then restart with the file in place.
    const appPort = await freePort();
    const base = `http://127.0.0.1:${appPort}`;
    const env = { ...process.env, ...dbEnv, NODE_ENV: 'production' as const, NEXT_TELEMETRY_DISABLED: '1', TRIALBED_DEMO: '1', AUTH_URL: base, PORT: String(appPort) };
    writeFileSync(staticFile, 'x');
    next = startNext(appPort, env);
    await waitFor(`${base}/api/ping`);
    const pageBytes = (await (await fetch(`${base}/feedstocks/orange-peel`)).arrayBuffer()).byteLength;
    writeFileSync(staticFile, `<!doctype html><title>bench</title><pre>${'x'.repeat(Math.max(0, pageBytes - 41))}</pre>`.slice(0, pageBytes));
    await stopGroup(next);
    next = startNext(appPort, env);
    await waitFor(`${base}/api/ping`);
    const staticBytes = (await (await fetch(`${base}/${staticName}`)).arrayBuffer()).byteLength;
    const guideBytes = (await (await fetch(`${base}/guides/reading-a-verdict`)).arrayBuffer()).byteLength;
    log(`next start on ${base}; page ${pageBytes} B, static file ${staticBytes} B, prerendered guide ${guideBytes} B`);

    const searchPath = (q: string) => `/api/search?q=${encodeURIComponent(q)}`;
    let unique = 0;
    const uniqueSearch = () => searchPath(`${QUERIES[unique % QUERIES.length]} ${(unique++).toString(36)}`);
    const pagePaths = ['/feedstocks/orange-peel'];
    const manyPages = gen.slugs.slice(0, 300).map((s) => `/feedstocks/${s}`);

    // Warm every path once (JIT, search index build, page cache). The 300 pages are rendered just before their
    // run, which comes last: 60 s after rendering they all turn stale at once and re-render in the background,
    // which would land in whatever is measured then.
    const warm = async (paths: string[]) => {
      for (const p of paths) await fetch(base + p).then((r) => r.arrayBuffer());
    };
    await warm([`/${staticName}`, '/api/ping', ...QUERIES.map(searchPath), ...pagePaths, '/guides/reading-a-verdict']);
    const pageCache = (await fetch(base + pagePaths[0])).headers.get('x-nextjs-cache');

    const results: RunResult[] = [];
    // Each measured run follows a short unrecorded one on the same paths, so every target is measured
    // with its code paths already optimised by the JIT (the first minute of a fresh server is slower).
    const measure = async (name: string, paths: string[] | (() => string), connections = CONNECTIONS) => {
      await run(`${name} (warm-up)`, base, paths, connections, WARMUP);
      const r = await run(name, base, paths, connections);
      results.push(r);
      log(`${name.padEnd(44)} c=${String(connections).padStart(2)}  ${r.rps.toFixed(0).padStart(6)} req/s  p50 ${r.p50.toFixed(1)} ms  p95 ${r.p95.toFixed(1)} ms  p99 ${r.p99.toFixed(1)} ms${r.bad ? `  (${r.bad} errors/non-2xx!)` : ''}`);
      return r;
    };
    // The page and its same-size static file are measured in turn, twice, and each averaged.
    const both = (a: RunResult, b: RunResult): RunResult => ({ ...b, rps: (a.rps + b.rps) / 2 });
    const staticA = await measure(`static file (${staticBytes} B)`, [`/${staticName}`]);
    const pageA = await measure(`feedstock page /feedstocks/orange-peel`, pagePaths);
    const staticR = both(staticA, await measure(`static file (${staticBytes} B), again`, [`/${staticName}`]));
    const pageR = both(pageA, await measure(`feedstock page /feedstocks/orange-peel, again`, pagePaths));
    const pingR = await measure('empty JSON route /api/ping', ['/api/ping']);
    const guideR = await measure(`prerendered guide page (${guideBytes} B)`, ['/guides/reading-a-verdict']);
    const searchR = await measure('search API, 40 queries (result cache warm)', QUERIES.map(searchPath));
    const coldR = await measure('search API, every query new (no cache)', uniqueSearch);
    const ping1 = await measure('empty JSON route, 1 connection', ['/api/ping'], 1);
    const search1 = await measure('search API warm, 1 connection', QUERIES.map(searchPath), 1);
    const cold1 = await measure('search API new queries, 1 connection', uniqueSearch, 1);
    const page1 = await measure('feedstock page, 1 connection', pagePaths, 1);
    await warm(manyPages);
    const manyR = await measure('feedstock pages, 300 different', manyPages);

    const ratio = (a: number, b: number) => (b ? a / b : NaN);
    const line = (label: string, value: number, target: string, ok: boolean | null) =>
      console.log(`  ${label.padEnd(58)} ${value.toFixed(2).padStart(6)}  ${target.padEnd(12)} ${ok === null ? '' : ok ? 'met' : 'MISSED'}`);
    console.log(`\nRatios (${CONNECTIONS} connections, ${DURATION} s per run, ${gen.existing + gen.added} feedstocks, ${os.cpus().length} cores, load average ${os.loadavg().map((x) => x.toFixed(1)).join(' / ')}):`);
    line('feedstock page req/s ÷ static file req/s', ratio(pageR.rps, staticR.rps), 'target ≥ 0.5', ratio(pageR.rps, staticR.rps) >= 0.5);
    line('feedstock page req/s ÷ prerendered page req/s', ratio(pageR.rps, guideR.rps), '', null);
    line('300 feedstock pages req/s ÷ static file req/s', ratio(manyR.rps, staticR.rps), '', null);
    line('search p95 ÷ empty route p95 (under load, warm)', ratio(searchR.p95, pingR.p95), 'target ≤ 1.5', ratio(searchR.p95, pingR.p95) <= 1.5);
    line('search p95 ÷ empty route p95 (under load, new queries)', ratio(coldR.p95, pingR.p95), 'target ≤ 1.5', ratio(coldR.p95, pingR.p95) <= 1.5);
    line('search p95 ÷ empty route p95 (1 connection, warm)', ratio(search1.p95, ping1.p95), 'target ≤ 1.5', ratio(search1.p95, ping1.p95) <= 1.5);
    line('search p95 ÷ empty route p95 (1 connection, new queries)', ratio(cold1.p95, ping1.p95), 'target ≤ 1.5', ratio(cold1.p95, ping1.p95) <= 1.5);
    console.log(`  feedstock page alone: p50 ${page1.p50.toFixed(1)} ms, p95 ${page1.p95.toFixed(1)} ms at 1 connection (page cache: ${pageCache})`);
    console.log('\n' + JSON.stringify({ feedstocks: gen.existing + gen.added, connections: CONNECTIONS, duration: DURATION, results }, null, 0));
  } finally {
    await stopGroup(next);
    rmSync(staticFile, { force: true });
    if (db) await db.stop();
    rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((err) => {
  console.error(`[bench] ${err instanceof Error ? (err.stack ?? err.message) : String(err)}`);
  process.exitCode = 1;
});
