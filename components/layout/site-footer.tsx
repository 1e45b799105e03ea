import Link from 'next/link';
import { CONTENT_LICENCE } from '@/lib/licence';
import { SafetyNote } from './safety-note';

export { CONTENT_LICENCE };

/** Site footer: handling safety, content licence, link to About. */
export function SiteFooter() {
  return (
    <footer className="mt-16 border-t border-line bg-surface-sunken">
      <div className="mx-auto grid max-w-page gap-8 px-4 py-10 md:grid-cols-[2fr_1fr]">
        <SafetyNote headingLevel={2} />
        <div className="space-y-3 text-ink">
          <h2 className="text-lg">Trialbed</h2>
          <p>
            Text and data are shared under{' '}
            <a href={CONTENT_LICENCE.url} rel="license">
              {CONTENT_LICENCE.name}
            </a>
            .
          </p>
          <p>
            <Link href="/about">About Trialbed</Link> — how verdicts are made and what they mean.
          </p>
          <p>
            Keep up: <Link href="/subscribe">follow by e-mail</Link> or the <a href="/feed.xml">Atom feed</a>.
          </p>
        </div>
      </div>
    </footer>
  );
}
