import { ACTIVITY_LABELS, ACTIVITY_LEVELS, formatDay, type WormActivity } from './vocabulary';

export type TimelineSeries = {
  /** Short name used in the legend and the text alternative, e.g. "This trial (Trial 12)". */
  label: string;
  points: readonly { day: number; date: string; shareRemainingPct: number; wormActivity: WormActivity }[];
  variant: 'main' | 'paired';
};

// A narrow canvas with large type, so the labels stay readable when a phone scales it down.
const W = 480;
const LEFT = 50;
const RIGHT = 16;
const TOP = 26;
const PLOT_H = 170;
const STRIP_H = 44;
const FONT = 15;
const PLOT_W = W - LEFT - RIGHT;
const ACTIVITY_R: Record<WormActivity, number> = { none: 4.5, few: 4.5, many: 7, swarming: 10 };

function dayTicks(maxDay: number): number[] {
  const step = [1, 2, 7, 14, 28, 56].find((s) => maxDay / s <= 8) ?? 112;
  const out: number[] = [];
  for (let d = 0; d <= maxDay; d += step) out.push(d);
  return out;
}

/** One sentence per series for the text alternative. */
function describe(s: TimelineSeries): string {
  if (!s.points.length) return `${s.label}: no check-ins yet.`;
  const first = s.points[0];
  const last = s.points[s.points.length - 1];
  const firstWorms = s.points.find((p) => p.wormActivity !== 'none');
  const rank = (a: WormActivity) => ACTIVITY_LEVELS.indexOf(a);
  const peak = s.points.reduce((a, p) => (rank(p.wormActivity) > rank(a.wormActivity) ? p : a), first);
  return (
    `${s.label}: ${s.points.length} check-in${s.points.length === 1 ? '' : 's'}; ` +
    `${first.shareRemainingPct}% left on day ${first.day}, ${last.shareRemainingPct}% on day ${last.day}. ` +
    (firstWorms ? `Worms first seen in the feed on day ${firstWorms.day}; most activity (${ACTIVITY_LABELS[peak.wormActivity].toLowerCase()}) on day ${peak.day}.` : 'No worms seen in the feed.')
  );
}

/**
 * Share of the dose remaining (line, 0–100 %) and worm activity (circles,
 * bigger = more worms) by day since the start, for a trial and its paired
 * trial. Server-rendered SVG with a title, a description in words and the
 * same numbers as a table, so it reads without the picture.
 */
export function TimelineChart({ series, id = 'timeline' }: { series: readonly TimelineSeries[]; id?: string }) {
  const all = series.flatMap((s) => s.points);
  const maxDay = Math.max(7, ...all.map((p) => p.day));
  const x = (day: number) => LEFT + (day / maxDay) * PLOT_W;
  const y = (share: number) => TOP + (1 - share / 100) * PLOT_H;
  const stripTop = TOP + PLOT_H + 14;
  const axisY = stripTop + series.length * STRIP_H + 8;
  const H = axisY + 40;
  const titleId = `${id}-title`;
  const descId = `${id}-desc`;
  const cls = (v: TimelineSeries['variant']) => (v === 'main' ? 'text-accent' : 'text-verdict-prepare');

  return (
    <figure className="space-y-3">
      <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-labelledby={`${titleId} ${descId}`} className="h-auto w-full max-w-xl rounded-lg border border-line bg-surface-raised">
        <title id={titleId}>Share of the dose remaining and worm activity by day</title>
        <desc id={descId}>{series.map(describe).join(' ')}</desc>
        {/* Share grid and axis */}
        {[0, 25, 50, 75, 100].map((v) => (
          <g key={v}>
            <line x1={LEFT} x2={W - RIGHT} y1={y(v)} y2={y(v)} stroke="#DCCFBA" strokeWidth={1} />
            <text x={LEFT - 6} y={y(v) + 5} textAnchor="end" fontSize={FONT - 1} fill="#5E5043">
              {v}%
            </text>
          </g>
        ))}
        <text x={LEFT} y={TOP - 10} fontSize={FONT} fill="#5E5043">
          share of the dose left
        </text>
        {/* Day ticks */}
        {dayTicks(maxDay).map((d) => (
          <g key={d}>
            <line x1={x(d)} x2={x(d)} y1={TOP} y2={axisY - 6} stroke="#EFE6D6" strokeWidth={1} />
            <text x={x(d)} y={axisY + 12} textAnchor="middle" fontSize={FONT} fill="#5E5043">
              {d}
            </text>
          </g>
        ))}
        <text x={LEFT + PLOT_W / 2} y={axisY + 32} textAnchor="middle" fontSize={FONT} fill="#5E5043">
          days since the start
        </text>
        {/* Share lines */}
        {series.map((s) => (
          <g key={s.label} className={cls(s.variant)}>
            <polyline
              fill="none"
              stroke="currentColor"
              strokeWidth={3}
              strokeDasharray={s.variant === 'paired' ? '7 5' : undefined}
              points={s.points.map((p) => `${x(p.day)},${y(p.shareRemainingPct)}`).join(' ')}
            />
            {s.points.map((p) =>
              s.variant === 'main' ? (
                <circle key={p.date} cx={x(p.day)} cy={y(p.shareRemainingPct)} r={5} fill="currentColor" />
              ) : (
                <rect key={p.date} x={x(p.day) - 5} y={y(p.shareRemainingPct) - 5} width={10} height={10} fill="currentColor" />
              ),
            )}
          </g>
        ))}
        {/* Worm activity strips */}
        {series.map((s, i) => {
          const cy = stripTop + i * STRIP_H + STRIP_H - 12;
          return (
            <g key={`${s.label}-strip`} className={cls(s.variant)}>
              <text x={LEFT} y={cy - 12} fontSize={FONT - 1} fill="#5E5043">
                worms in the feed{series.length > 1 ? ` (${s.label.toLowerCase()})` : ''}
              </text>
              <line x1={LEFT} x2={W - RIGHT} y1={cy} y2={cy} stroke="#DCCFBA" strokeWidth={1} />
              {s.points.map((p) => (
                <circle
                  key={p.date}
                  cx={x(p.day)}
                  cy={cy}
                  r={ACTIVITY_R[p.wormActivity]}
                  fill={p.wormActivity === 'none' ? '#FFFDF8' : 'currentColor'}
                  stroke="currentColor"
                  strokeWidth={1.5}
                />
              ))}
            </g>
          );
        })}
      </svg>
      <figcaption className="space-y-2 text-sm">
        <ul className="m-0 flex list-none flex-wrap gap-x-6 gap-y-1 p-0">
          {series.map((s) => (
            <li key={s.label} className={`flex items-center gap-2 ${cls(s.variant)}`}>
              <svg width="28" height="10" aria-hidden="true">
                <line x1="0" x2="28" y1="5" y2="5" stroke="currentColor" strokeWidth="2.5" strokeDasharray={s.variant === 'paired' ? '7 5' : undefined} />
              </svg>
              <span className="text-ink">{s.label}</span>
            </li>
          ))}
          <li className="text-ink-muted">Circles below: worms in the feed (hollow = none; bigger = more).</li>
        </ul>
        <details>
          <summary className="cursor-pointer font-semibold">The chart’s numbers as a table</summary>
          <table className="mt-2 w-full border-collapse text-left [&_td]:border-t [&_td]:border-line [&_td]:px-2 [&_td]:py-1 [&_th]:px-2 [&_th]:py-1">
            <thead>
              <tr>
                <th scope="col">Trial</th>
                <th scope="col">Day</th>
                <th scope="col">Date</th>
                <th scope="col">Left</th>
                <th scope="col">Worms</th>
              </tr>
            </thead>
            <tbody>
              {series.flatMap((s) =>
                s.points.map((p) => (
                  <tr key={`${s.label}-${p.date}`}>
                    <td>{s.label}</td>
                    <td>{p.day}</td>
                    <td>{formatDay(p.date)}</td>
                    <td>{p.shareRemainingPct}%</td>
                    <td>{ACTIVITY_LABELS[p.wormActivity]}</td>
                  </tr>
                )),
              )}
            </tbody>
          </table>
        </details>
      </figcaption>
    </figure>
  );
}
