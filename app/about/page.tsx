import type { Metadata } from 'next';
import Link from 'next/link';
import {
  CERTAINTY_GRADES,
  CertaintyBadge,
} from '@/components/evidence/verdict-badge';
import { SafetyNote } from '@/components/layout/safety-note';
import { CONTENT_LICENCE } from '@/components/layout/site-footer';
import { VerdictLegend } from '@/components/layout/verdict-legend';
import {
  CERTAINTY_DESCRIPTIONS,
  SETTINGS,
  SETTING_DESCRIPTIONS,
  SETTING_LABELS,
} from '@/components/layout/vocabulary';

export const metadata: Metadata = {
  title: 'About',
  description:
    'What Trialbed is, what its verdicts and certainty grades mean, how to stay safe handling compost, and how the content is licensed.',
};

export default function AboutPage() {
  const isDemo = process.env.TRIALBED_DEMO === '1';

  return (
    <article className="max-w-prose space-y-10">
      <header className="space-y-3">
        <h1 className="text-4xl">About Trialbed</h1>
        <p className="text-lg">
          Trialbed is a community reference for people who keep composting worms — in a home bin, a
          school or community-garden compost program, or a small vermicompost operation. Each
          feedstock (a food scrap, bedding material, garden waste or manure) has a page that answers
          one question: can my worms eat this, how much at once, prepared how, and what should I
          watch for?
        </p>
        <p>
          The answers come from feeding trials that keepers log: a measured dose in a bed, checked
          every week or two. The server turns those trials into an evidence verdict, contributors
          propose and vote on the published verdict, and a moderator decides.
        </p>
      </header>

      <section aria-labelledby="about-verdicts" className="space-y-4">
        <h2 id="about-verdicts" className="text-2xl">
          Verdicts
        </h2>
        <p>
          A feedstock gets one of five verdicts for each setting. Each verdict always appears with
          its symbol and its words; colour is only a help.
        </p>
        <VerdictLegend columns={1} />
        <p>Verdicts are given separately for each setting, because worms cope differently in each:</p>
        <dl className="space-y-2">
          {SETTINGS.map((setting) => (
            <div key={setting}>
              <dt className="font-semibold">{SETTING_LABELS[setting]}</dt>
              <dd className="m-0">{SETTING_DESCRIPTIONS[setting]}</dd>
            </div>
          ))}
        </dl>
      </section>

      <section aria-labelledby="about-certainty" className="space-y-4">
        <h2 id="about-certainty" className="text-2xl">
          Certainty
        </h2>
        <p>
          Every verdict carries a certainty grade. The four grades and the reasons for lowering one
          — risk of bias, inconsistency, indirectness and imprecision — come from the GRADE approach
          to grading evidence. Here they depend on how many independent keepers ran trials, whether
          the trials agree, whether they had photos and control plots, and whether they were done in
          the same setting and preparation.
        </p>
        <dl className="space-y-3">
          {CERTAINTY_GRADES.map((grade) => (
            <div key={grade} className="flex flex-col items-start gap-1">
              <dt>
                <CertaintyBadge grade={grade} />
              </dt>
              <dd className="m-0">{CERTAINTY_DESCRIPTIONS[grade]}</dd>
            </div>
          ))}
        </dl>
      </section>

      <section aria-labelledby="about-safety" className="space-y-3">
        <h2 id="about-safety" className="text-2xl">
          Safety
        </h2>
        <p>
          Worm keeping is low-risk, but compost, potting mix and manures are living material and
          garden machines are sharp. Trialbed is a shared record of what keepers have observed, not
          professional advice: we defer to local regulations and licensed advice, and so should you.
        </p>
        <SafetyNote headingLevel={3} className="rounded-lg border border-line bg-surface-raised p-4" />
      </section>

      <section aria-labelledby="about-licence" className="space-y-3">
        <h2 id="about-licence" className="text-2xl">
          Licence
        </h2>
        <p>
          Text and data are shared under{' '}
          <a href={CONTENT_LICENCE.url} rel="license">
            {CONTENT_LICENCE.name}
          </a>
          : you may copy and adapt them, including commercially, as long as you credit Trialbed and
          its contributors and share what you make under the same licence.
        </p>
      </section>

      <section aria-labelledby="about-demo" className="space-y-3">
        <h2 id="about-demo" className="text-2xl">
          Demo data
        </h2>
        <p>
          {isDemo
            ? 'This copy of Trialbed runs on demo data: the people, gardens and trials on it are invented, and its verdicts are not advice about real worms.'
            : 'Demo installations of Trialbed run on invented people, gardens and trials, and say so in a banner at the top of every page. Verdicts on a demo site are not advice about real worms.'}
        </p>
        <p>
          <Link href="/feedstocks">Browse feedstocks</Link>
        </p>
      </section>
    </article>
  );
}
