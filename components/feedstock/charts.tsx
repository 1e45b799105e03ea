import type { ReactNode } from 'react';
import { formatLoad, formatNumber, loadIn, loadUnit, type Units } from '@/lib/format';
import { OUTCOME_LABELS, PREPARATION_LABELS, type OutcomeCode } from './vocabulary';

/*
 * Hand-written SVG charts, rendered on the server. Each has a title and a
 * text summary for assistive technology, marks are told apart by shape or
 * line pattern (never colour alone), and the numbers are also in a table.
 */

// ---------------------------------------------------------------- outcome against load

type Row = OutcomeCode | 'none';
const ROWS: Row[] = ['consumed', 'partial', 'rejected', 'harm', 'none'];
const ROW_LABELS: Record<Row, string> = { ...OUTCOME_LABELS, none: 'No outcome yet' };

/** A distinct shape per outcome, centred on (0, 0). */
function Marker({ row }: { row: Row }) {
  switch (row) {
    case 'consumed':
      return <circle r="5" fill="currentColor" />;
    case 'partial':
      return <rect x="-4.5" y="-4.5" width="9" height="9" fill="currentColor" />;
    case 'rejected':
      return <path d="M0 -6 L6 0 L0 6 L-6 0 Z" fill="none" stroke="currentColor" strokeWidth="2" />;
    case 'harm':
      return <path d="M-5 -5 L5 5 M5 -5 L-5 5" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" />;
    default:
      return <circle r="4.5" fill="none" stroke="currentColor" strokeWidth="1.5" strokeDasharray="2 2" />;
  }
}

/** Marker legend, for the text around the chart. */
export function OutcomeLegend() {
  return (
    <ul className="flex list-none flex-wrap gap-x-4 gap-y-1 p-0 text-sm" aria-label="Chart key">
      {ROWS.map((r) => (
        <li key={r} className="inline-flex items-center gap-1.5">
          <svg width="14" height="14" viewBox="-7 -7 14 14" aria-hidden="true" focusable="false" className="text-ink">
            <Marker row={r} />
          </svg>
          {ROW_LABELS[r]}
        </li>
      ))}
    </ul>
  );
}

const NICE = [0.01, 0.02, 0.05, 0.1, 0.2, 0.5, 1, 2, 5, 10, 20, 50, 100, 200, 500];

/** A trial mark on the outcome chart. */
export interface OutcomePoint {
  id: number;
  preparation: string;
  loadKgM2: number;
  outcome: OutcomeCode | null;
  status: string;
}

/**
 * Each trial's outcome against its surface load for one setting, on a log
 * scale (loads span two orders of magnitude). A published dose ceiling is
 * drawn as a dashed line.
 */
export function OutcomeChart({
  title,
  points,
  units,
  ceilingKgM2,
  domainKgM2,
}: {
  title: string;
  points: OutcomePoint[];
  units: Units;
  ceilingKgM2: number | null;
  /** Shared x range across the page's charts, in kg/m². */
  domainKgM2: [number, number];
}) {
  const W = 520;
  const rowH = 28;
  const left = 112;
  const right = 16;
  const top = 12;
  const plotH = rowH * ROWS.length;
  const H = top + plotH + 44;
  const [lo, hi] = domainKgM2.map((x) => loadIn(x, units));
  const ticks = NICE.filter((t) => t >= lo * 0.999 && t <= hi * 1.001);
  const lx = (v: number) => Math.log10(Math.max(v, lo));
  const x = (kgM2: number) => left + ((lx(loadIn(kgM2, units)) - lx(lo)) / Math.max(1e-9, lx(hi) - lx(lo))) * (W - left - right);
  const y = (r: Row) => top + ROWS.indexOf(r) * rowH + rowH / 2;
  const counts = ROWS.map((r) => [r, points.filter((p) => (p.outcome ?? 'none') === r).length] as const).filter(([, n]) => n > 0);
  const titleId = `chart-${title.replace(/[^a-z0-9]+/gi, '-').toLowerCase()}-${units}`;
  const seen = new Map<string, number>();
  const summary =
    `${points.length} ${points.length === 1 ? 'trial' : 'trials'} from ${formatLoad(Math.min(...points.map((p) => p.loadKgM2)), units)} to ${formatLoad(Math.max(...points.map((p) => p.loadKgM2)), units)}: ` +
    counts.map(([r, n]) => `${ROW_LABELS[r].toLowerCase()} ${n}`).join(', ') +
    (ceilingKgM2 !== null ? `. Published dose ceiling ${formatLoad(ceilingKgM2, units)}.` : '.');

  return (
    <figure className="space-y-2">
      <div role="region" aria-label={title} tabIndex={0} className="overflow-x-auto">
      <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-labelledby={`${titleId}-t ${titleId}-d`} className="h-auto w-full min-w-[30rem] max-w-3xl text-ink">
        <title id={`${titleId}-t`}>{title}</title>
        <desc id={`${titleId}-d`}>{summary}</desc>
        {ROWS.map((r, i) => (
          <g key={r}>
            {i % 2 === 0 ? <rect x={left} y={top + i * rowH} width={W - left - right} height={rowH} className="fill-surface-sunken" /> : null}
            <text x={left - 8} y={y(r) + 4} textAnchor="end" fontSize="14" className="fill-ink">
              {ROW_LABELS[r]}
            </text>
          </g>
        ))}
        {ticks.map((t) => {
          const tx = left + ((lx(t) - lx(lo)) / Math.max(1e-9, lx(hi) - lx(lo))) * (W - left - right);
          return (
            <g key={t}>
              <line x1={tx} x2={tx} y1={top} y2={top + plotH} className="stroke-line" />
              <text x={tx} y={top + plotH + 16} textAnchor="middle" fontSize="13" className="fill-ink-muted">
                {formatNumber(t)}
              </text>
            </g>
          );
        })}
        <text x={left + (W - left - right) / 2} y={H - 6} textAnchor="middle" fontSize="14" className="fill-ink">
          Surface load per application ({loadUnit(units)}, log scale)
        </text>
        {ceilingKgM2 !== null ? (
          <g>
            <line x1={x(ceilingKgM2)} x2={x(ceilingKgM2)} y1={top - 4} y2={top + plotH} stroke="currentColor" strokeWidth="1.5" strokeDasharray="5 4" />
            <text x={x(ceilingKgM2) + 4} y={top + 8} fontSize="11" className="fill-ink">
              ceiling
            </text>
          </g>
        ) : null}
        {points.map((p) => {
          const row: Row = p.outcome ?? 'none';
          const key = `${row}:${Math.round(x(p.loadKgM2))}`;
          const k = seen.get(key) ?? 0;
          seen.set(key, k + 1);
          // Trials at the same load and outcome fan out vertically so each stays visible.
          const dy = k === 0 ? 0 : (k % 2 === 1 ? -1 : 1) * Math.ceil(k / 2) * 5;
          return (
            <g key={p.id} transform={`translate(${x(p.loadKgM2).toFixed(1)} ${(y(row) + dy).toFixed(1)})`} className={row === 'harm' ? 'text-verdict-avoid' : 'text-ink'}>
              <title>{`Trial ${p.id}: ${PREPARATION_LABELS[p.preparation] ?? p.preparation}, ${formatLoad(p.loadKgM2, units)}, ${ROW_LABELS[row].toLowerCase()}`}</title>
              <Marker row={row} />
            </g>
          );
        })}
      </svg>
      </div>
      <figcaption className="text-sm text-ink-muted">{summary}</figcaption>
    </figure>
  );
}

// ---------------------------------------------------------------- Kaplan–Meier

/** One preparation's survival table (from the engine). */
export interface SurvivalCurve {
  preparation: string;
  n: number;
  events: number;
  censored: number;
  median: number | null;
  medianLower: number | null;
  medianUpper: number | null;
  table: { time: number; atRisk: number; events: number; censored: number; survival: number }[];
}

const DASHES = ['', '7 4', '2 3', '9 3 2 3', '4 4', '1 2'];

function stepPath(c: SurvivalCurve, x: (t: number) => number, y: (s: number) => number, maxT: number): string {
  let d = `M${x(0)} ${y(1)}`;
  let s = 1;
  for (const row of c.table) {
    d += ` H${x(row.time).toFixed(1)}`;
    if (row.survival !== s) {
      s = row.survival;
      d += ` V${y(s).toFixed(1)}`;
    }
  }
  const last = c.table.length ? c.table[c.table.length - 1].time : 0;
  if (last < maxT) d += ` H${x(maxT).toFixed(1)}`;
  return d;
}

/** Median time to consumption as words: "14 days (95% interval 9–21)". */
export function medianWords(c: Pick<SurvivalCurve, 'median' | 'medianLower' | 'medianUpper'>): string {
  if (c.median === null) return 'not reached (more than half the trials still had feed left at their last check-in)';
  const ci =
    c.medianLower !== null ? ` (95% interval ${formatNumber(c.medianLower, 3)}–${c.medianUpper !== null ? formatNumber(c.medianUpper, 3) : 'not reached'})` : '';
  return `${formatNumber(c.median, 3)} days${ci}`;
}

/**
 * Kaplan–Meier curves of time to consumption for one setting: the share of
 * trials with feed still left against days since feeding, one step line per
 * preparation (told apart by line pattern and a label), censored trials
 * marked with a tick.
 */
export function SurvivalChart({ title, curves }: { title: string; curves: SurvivalCurve[] }) {
  const W = 560;
  const H = 270;
  const left = 52;
  const right = 150;
  const top = 14;
  const bottom = 44;
  const maxT = Math.max(7, ...curves.flatMap((c) => c.table.map((r) => r.time)));
  const step = maxT <= 28 ? 7 : maxT <= 70 ? 14 : 28;
  const xMax = Math.ceil(maxT / step) * step;
  const x = (t: number) => left + (t / xMax) * (W - left - right);
  const y = (s: number) => top + (1 - s) * (H - top - bottom);
  const titleId = `km-${title.replace(/[^a-z0-9]+/gi, '-').toLowerCase()}`;
  const summary = curves
    .map((c) => `${PREPARATION_LABELS[c.preparation] ?? c.preparation}: ${c.n} ${c.n === 1 ? 'trial' : 'trials'}, ${c.events} consumed, ${c.censored} still running or stopped; median ${medianWords(c)}`)
    .join('. ');
  const labels: ReactNode[] = [];
  const used: number[] = [];
  curves.forEach((c, i) => {
    const endS = c.table.length ? c.table[c.table.length - 1].survival : 1;
    let ly = y(endS) + 4;
    while (used.some((u) => Math.abs(u - ly) < 14)) ly += 14;
    used.push(ly);
    labels.push(
      <g key={`l-${c.preparation}`}>
        <line x1={x(xMax) + 6} x2={x(xMax) + 30} y1={ly - 4} y2={ly - 4} stroke="currentColor" strokeWidth="2" strokeDasharray={DASHES[i % DASHES.length]} />
        <text x={x(xMax) + 34} y={ly} fontSize="13" className="fill-ink">
          {`${PREPARATION_LABELS[c.preparation] ?? c.preparation} (${c.n})`}
        </text>
      </g>,
    );
  });

  return (
    <figure className="space-y-2">
      <div role="region" aria-label={title} tabIndex={0} className="overflow-x-auto">
      <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-labelledby={`${titleId}-t ${titleId}-d`} className="h-auto w-full min-w-[30rem] max-w-3xl text-ink">
        <title id={`${titleId}-t`}>{title}</title>
        <desc id={`${titleId}-d`}>{summary}</desc>
        {[0, 0.25, 0.5, 0.75, 1].map((s) => (
          <g key={s}>
            <line x1={left} x2={x(xMax)} y1={y(s)} y2={y(s)} className="stroke-line" strokeDasharray={s === 0.5 ? '3 3' : undefined} />
            <text x={left - 6} y={y(s) + 4} textAnchor="end" fontSize="13" className="fill-ink-muted">
              {`${Math.round(s * 100)}%`}
            </text>
          </g>
        ))}
        {Array.from({ length: xMax / step + 1 }, (_, k) => k * step).map((t) => (
          <text key={t} x={x(t)} y={H - bottom + 16} textAnchor="middle" fontSize="13" className="fill-ink-muted">
            {t}
          </text>
        ))}
        <text x={left + (x(xMax) - left) / 2} y={H - 6} textAnchor="middle" fontSize="14" className="fill-ink">
          Days since feeding
        </text>
        <text x={14} y={top + (H - top - bottom) / 2} fontSize="14" className="fill-ink" transform={`rotate(-90 14 ${top + (H - top - bottom) / 2})`} textAnchor="middle">
          Trials with feed left
        </text>
        {curves.map((c, i) => (
          <g key={c.preparation}>
            <path d={stepPath(c, x, y, xMax)} fill="none" stroke="currentColor" strokeWidth="2" strokeDasharray={DASHES[i % DASHES.length]} />
            {c.table
              .filter((r) => r.censored > 0)
              .map((r) => (
                <line key={r.time} x1={x(r.time)} x2={x(r.time)} y1={y(r.survival) - 5} y2={y(r.survival) + 5} stroke="currentColor" strokeWidth="1.5" />
              ))}
          </g>
        ))}
        {labels}
      </svg>
      </div>
      <figcaption className="text-sm text-ink-muted">
        Steps down when a trial&rsquo;s feed was eaten; a short tick marks a trial still running or stopped early (censored, not dropped).
      </figcaption>
    </figure>
  );
}
