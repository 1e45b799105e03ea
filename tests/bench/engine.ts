/**
 * Benchmark of the evidence engine: aggregation time and memory for one
 * feedstock at 1k, 10k and 100k trials with 10 check-ins each.
 * Run: npx tsx tests/bench/engine.ts (or `npm run bench`, which runs every benchmark)
 * Targets: 10k under 200 ms; 100k no more than 12 × the 10k time.
 */
import { loadavg } from 'node:os';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { aggregateFeedstock } from '../../lib/evidence/aggregate';
import type { CheckIn, Preparation, Setting, TrialInput } from '../../lib/evidence/types';

// `npm run bench` passes --expose-gc; run directly (npx tsx), expose it here.
const gc: () => void =
  typeof (globalThis as { gc?: () => void }).gc === 'function'
    ? ((globalThis as { gc?: () => void }).gc as () => void)
    : (setFlagsFromString('--expose-gc'), runInNewContext('gc') as () => void);

function mulberry32(a: number): () => number {
  return () => {
    a |= 0;
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const SETTINGS: Setting[] = ['bin', 'flow-through', 'bed'];
const PREPS: Preparation[] = ['raw', 'chopped', 'pre-composted'];

function pad(n: number): string {
  return n < 10 ? `0${n}` : String(n);
}
function dateAfter(startDay: number, days: number): string {
  const d = new Date(Date.UTC(2024, 0, 1) + (startDay + days) * 86400000);
  return `${d.getUTCFullYear()}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())}`;
}

/** Synthetic trials: random loads 0.2–20 kg/m², heavier loads are slower and heat more. */
export function makeTrials(n: number, prngState = 42): TrialInput[] {
  const rnd = mulberry32(prngState);
  const out: TrialInput[] = [];
  for (let i = 0; i < n; i++) {
    const load = Math.round((0.2 + rnd() * 19.8) * 1000) / 1000;
    const startDay = Math.floor(rnd() * 300);
    const speed = Math.max(0.02, 0.25 - load * 0.012 + (rnd() - 0.5) * 0.1);
    const checkIns: CheckIn[] = [];
    let share = 100;
    for (let k = 1; k <= 10; k++) {
      share = Math.max(0, share - speed * 100 * (0.5 + rnd()));
      const temp = 15 + load * 0.9 + rnd() * 6;
      checkIns.push({
        date: dateAfter(startDay, k * 7),
        wormActivity: share > 90 ? 'none' : share > 40 ? 'few' : 'many',
        shareRemainingPct: Math.round(share),
        bedTempC: Math.round(temp * 10) / 10,
        mould: rnd() < 0.05,
        smell: rnd() < 0.05 ? 'sour' : 'earthy',
        moisture: rnd() < 0.03 ? 'waterlogged' : 'damp',
        pH: 6 + rnd() * 2,
        pests: rnd() < 0.1 ? ['springtails'] : rnd() < 0.05 ? ['fruit-flies'] : [],
        wormDeaths: rnd() < 0.002 * load,
        exodus: false,
      });
    }
    const r = rnd();
    out.push({
      id: `t${String(i).padStart(7, '0')}`,
      contributorId: `c${Math.floor(rnd() * Math.max(10, n / 20))}`,
      setting: SETTINGS[i % 3],
      preparation: PREPS[Math.floor(i / 3) % 3],
      status: r < 0.8 ? 'closed' : r < 0.93 ? 'running' : 'abandoned',
      startDate: dateAfter(startDay, 0),
      surfaceLoadKgM2: load,
      hasControl: rnd() < 0.4,
      photoCount: rnd() < 0.7 ? 2 : 0,
      checkIns,
    });
  }
  return out;
}

function median(xs: number[]): number {
  const s = xs.slice().sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

interface Row {
  n: number;
  runs: number;
  medianMs: number;
  minMs: number;
  cpuMedianMs: number;
  heapDeltaMB: number;
  retainedMB: number;
}

/**
 * One size at a time, so each size runs with only its own input on the heap
 * (holding every input at once makes the small sizes pay for collecting the big one).
 */
function bench(n: number, runs: number): Row {
  // JSON round trip: inputs look like what an API or database hands over (flat strings, plain objects)
  let trials: TrialInput[] | null = JSON.parse(JSON.stringify(makeTrials(n))) as TrialInput[];
  for (let w = 0; w < 3; w++) aggregateFeedstock(trials); // warm-up (JIT)
  const times: number[] = [];
  const cpuTimes: number[] = [];
  let heapDelta = 0;
  let retained = 0;
  for (let r = 0; r < runs; r++) {
    gc();
    const before = process.memoryUsage().heapUsed;
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    const result = aggregateFeedstock(trials);
    const t1 = performance.now();
    const c1 = process.cpuUsage(c0);
    const after = process.memoryUsage().heapUsed;
    gc();
    const kept = process.memoryUsage().heapUsed;
    if (result.groups.length === 0) throw new Error('no groups');
    times.push(t1 - t0);
    cpuTimes.push((c1.user + c1.system) / 1000);
    heapDelta = Math.max(heapDelta, after - before);
    retained = Math.max(retained, kept - before);
  }
  trials = null;
  gc();
  return {
    n,
    runs,
    medianMs: median(times),
    minMs: Math.min(...times),
    cpuMedianMs: median(cpuTimes),
    heapDeltaMB: heapDelta / 2 ** 20,
    retainedMB: retained / 2 ** 20,
  };
}

const rows = [bench(1_000, 15), bench(10_000, 11), bench(100_000, 5)];
console.log('Evidence engine: aggregateFeedstock, one feedstock, 10 check-ins per trial');
console.log('trials   runs  median ms   min ms  CPU median ms  heap delta MB*  result retained MB');
for (const r of rows) {
  console.log(
    `${String(r.n).padStart(7)}  ${String(r.runs).padStart(4)}  ${r.medianMs.toFixed(1).padStart(9)}  ${r.minMs.toFixed(1).padStart(7)}  ${r.cpuMedianMs.toFixed(1).padStart(13)}  ${r.heapDeltaMB.toFixed(1).padStart(14)}  ${r.retainedMB.toFixed(1).padStart(18)}`,
  );
}
console.log('median / min: wall-clock; CPU: user + system time of this process during the call (less sensitive to other load on the machine)');
console.log('* heap used right after the call minus before it (GC forced before; includes garbage not yet collected, so it approximates the peak)');
console.log(`load average when run: ${loadavg().map((x) => x.toFixed(2)).join(' ')}`);
console.log(`max RSS of this process: ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB (includes the generated inputs)`);
const t10k = rows[1].medianMs;
const t100k = rows[2].medianMs;
const ok1 = t10k < 200;
const ok2 = t100k <= 12 * t10k;
console.log(`target 10k < 200 ms: ${ok1 ? 'holds' : 'FAILS'} (${t10k.toFixed(1)} ms)`);
console.log(`target 100k <= 12 x 10k: ${ok2 ? 'holds' : 'FAILS'} (${(t100k / t10k).toFixed(2)} x)`);
if (!ok1 || !ok2) process.exitCode = 1;
