import type { CheckInDto } from '@/lib/queries/trials';
import { MarkdownNotes } from './markdown-notes';
import { PhotoGallery } from './photo-gallery';
import { ACTIVITY_LABELS, formatDay, formatNumber, MOISTURE_LABELS, PEST_LABELS, SMELL_LABELS } from './vocabulary';

function tempText(c: number): string {
  return `${formatNumber(c, 1)} °C (${formatNumber(c * 1.8 + 32, 0)} °F)`;
}

/** A trial's check-ins, oldest first, with what was seen, notes and photos. */
export function CheckInList({ checkIns }: { checkIns: readonly CheckInDto[] }) {
  if (!checkIns.length) return <p className="text-ink-muted">No check-ins yet.</p>;
  return (
    <ol className="m-0 list-none space-y-4 p-0">
      {checkIns.map((c) => {
        const warnings = [
          c.wormDeaths && 'dead worms',
          c.exodus && 'worms leaving',
          c.mould && 'mould',
        ].filter(Boolean) as string[];
        const pests = c.pests.filter((p) => p !== 'springtails');
        return (
          <li key={c.id} id={`check-in-${c.id}`}>
            <article className="rounded-lg border border-line bg-surface-raised p-4" aria-labelledby={`check-in-${c.id}-h`}>
              <h3 id={`check-in-${c.id}-h`} className="text-lg">
                Day {c.day} · <time dateTime={c.observedOn}>{formatDay(c.observedOn)}</time>
              </h3>
              <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 sm:grid-cols-[auto_1fr_auto_1fr]">
                <dt className="text-ink-muted">Left</dt>
                <dd className="m-0 font-semibold">{formatNumber(c.shareRemainingPct)}%</dd>
                <dt className="text-ink-muted">Worms</dt>
                <dd className="m-0">{ACTIVITY_LABELS[c.wormActivity]}</dd>
                <dt className="text-ink-muted">Smell</dt>
                <dd className="m-0">{SMELL_LABELS[c.smell]}</dd>
                <dt className="text-ink-muted">Moisture</dt>
                <dd className="m-0">{MOISTURE_LABELS[c.moisture].split(' (')[0]}</dd>
                {c.bedTempC !== null ? (
                  <>
                    <dt className="text-ink-muted">Bed</dt>
                    <dd className="m-0">{tempText(c.bedTempC)}</dd>
                  </>
                ) : null}
                {c.ph !== null ? (
                  <>
                    <dt className="text-ink-muted">pH</dt>
                    <dd className="m-0">{formatNumber(c.ph, 1)}</dd>
                  </>
                ) : null}
              </dl>
              {warnings.length || pests.length ? (
                <p className="mt-2">
                  <span className="font-semibold text-verdict-avoid">Seen: </span>
                  {[...warnings, ...pests.map((p) => PEST_LABELS[p].toLowerCase())].join(', ')}
                </p>
              ) : null}
              {c.pests.includes('springtails') ? <p className="mt-1 text-sm text-ink-muted">Springtails seen (harmless decomposers).</p> : null}
              <MarkdownNotes source={c.notes} className="mt-2" />
              {c.photos.length ? <div className="mt-3"><PhotoGallery photos={c.photos} label={`Photos of day ${c.day}`} /></div> : null}
            </article>
          </li>
        );
      })}
    </ol>
  );
}
