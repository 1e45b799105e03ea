import Link from 'next/link';
import { getActor } from '@/lib/auth/actor';
import { listRecentDecisions } from '@/lib/queries/home';
import { listTrialsNeedingCheckIns } from '@/lib/queries/trials';
import { SearchBox } from '@/components/search/search-box';
import { RecentDecisions, TrialsNeedingCheckIns } from '@/components/layout/home-sections';
import { VerdictLegend } from '@/components/layout/verdict-legend';
import { SETTINGS, SETTING_DESCRIPTIONS, SETTING_LABELS } from '@/components/layout/vocabulary';

// Recent decisions come from the database on each request.
export const dynamic = 'force-dynamic';

export default async function HomePage() {
  const [recentDecisions, actor] = await Promise.all([listRecentDecisions(), getActor()]);
  // The signed-in keeper's own running trials whose next check-in is due; hidden for visitors.
  const trialsNeedingCheckIns = actor ? await listTrialsNeedingCheckIns(actor.id) : null;

  return (
    <div className="space-y-14">
      <section className="rounded-xl border border-line bg-surface-raised px-4 py-8 sm:px-8 sm:py-10">
        <SearchBox variant="hero" labelAsHeading />
        <p className="mt-4 max-w-prose text-lg text-ink-muted">
          How much at once, prepared how, and what to watch for — for enclosed bins, flow-through
          systems and open beds, worked out from feeding trials that worm keepers log.
        </p>
      </section>

      <section aria-labelledby="verdicts-heading" className="space-y-4">
        <h2 id="verdicts-heading" className="text-2xl">
          Five verdicts
        </h2>
        <p className="max-w-prose">
          Every feedstock gets one verdict per setting. Each verdict has its own symbol and words,
          so it reads the same in black and white.
        </p>
        <VerdictLegend />
      </section>

      <section aria-labelledby="settings-heading" className="space-y-4">
        <h2 id="settings-heading" className="text-2xl">
          Three settings
        </h2>
        <p className="max-w-prose">
          The same dose can be harmless in one setup and deadly in another, so verdicts are given
          separately for each.
        </p>
        <dl className="grid gap-3 md:grid-cols-3">
          {SETTINGS.map((setting) => (
            <div key={setting} className="rounded-lg border border-line bg-surface-raised p-4">
              <dt className="font-display text-lg">{SETTING_LABELS[setting]}</dt>
              <dd className="m-0 mt-1">{SETTING_DESCRIPTIONS[setting]}</dd>
            </div>
          ))}
        </dl>
      </section>

      <section aria-labelledby="how-heading" className="space-y-4">
        <h2 id="how-heading" className="text-2xl">
          How a verdict is made
        </h2>
        <p className="max-w-prose">
          Keepers run <strong>trials</strong>: a measured amount of one feedstock in a bed, checked
          every week or two for worm activity, leftovers, heat, mould, smell and pests. The server
          combines those trials into an <strong>evidence verdict</strong> for each setting and
          preparation, with a dose ceiling, a list of cautions, a certainty grade and the working
          behind it. A contributor who thinks the published verdict should change writes a{' '}
          <strong>proposal</strong> citing trials, and other contributors <strong>vote</strong> on
          it with a reason. Votes alone never publish anything: a <strong>moderator</strong> reads
          the proposal and the evidence and decides, with a written note.
        </p>
        <p className="max-w-prose">
          <Link href="/about">More about verdicts and certainty</Link>
          {' · '}
          <Link href="/trials">Browse trials</Link>
        </p>
      </section>

      <div className="grid gap-10 md:grid-cols-2">
        <RecentDecisions decisions={recentDecisions} />
        {trialsNeedingCheckIns ? <TrialsNeedingCheckIns trials={trialsNeedingCheckIns} /> : null}
      </div>
    </div>
  );
}
