import type { Metadata } from 'next';
import Link from 'next/link';
import { SubscribePanel } from '@/components/subscription/subscribe-panel';

export const metadata: Metadata = {
  title: 'Follow every feedstock',
  alternates: { types: { 'application/atom+xml': [{ url: '/feed.xml', title: 'Trialbed — updates on every feedstock' }] } },
};

/** Follow the whole site by e-mail (or its Atom feed). */
export default function SubscribePage() {
  return (
    <div className="mx-auto max-w-prose space-y-6">
      <header className="space-y-2">
        <h1 className="text-4xl">Follow Trialbed</h1>
        <p>
          Get an e-mail when any feedstock&rsquo;s verdict is decided, a proposal opens, a trial is linked or a page is edited — or
          one weekly digest. To follow a single feedstock, open <Link href="/feedstocks">its page</Link> and choose{' '}
          <strong>Follow by e-mail</strong> there.
        </p>
      </header>
      <SubscribePanel feedstockId={null} feedstockSlug={null} feedstockName="every feedstock" />
    </div>
  );
}
