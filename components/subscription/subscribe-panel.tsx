'use client';

import Link from 'next/link';
import { useActionState, useEffect, useState } from 'react';
import useSWR from 'swr';
import { subscribeToUpdates, type SubscribeFormState } from '@/app/subscriptions/actions';
import { fieldError, FormMessage } from '@/components/account/form-message';
import { Button, Field } from '@/components/ui';
import type { MySubscriptionsDTO } from '@/lib/queries/subscriptions';
import { ModeChoice, MODE_LABELS } from './mode-choice';

export type SubscribePanelProps = {
  /** The feedstock to follow; null follows every feedstock. */
  feedstockId: number | null;
  /** Its slug, for the Atom feed link; null for the whole site. */
  feedstockSlug: string | null;
  /** Its name for the button ("Follow Orange peel"); "this feedstock" when not given. */
  feedstockName?: string;
  /** The heading level where the panel sits on its page. */
  headingLevel?: 2 | 3;
};

export const SUBSCRIPTIONS_KEY = '/api/subscriptions';

const fetchSubscriptions = async (url: string): Promise<MySubscriptionsDTO> => {
  const res = await fetch(url, { credentials: 'same-origin', cache: 'no-store' });
  if (!res.ok) throw new Error(`subscriptions ${res.status}`);
  return res.json();
};

/**
 * "Follow by e-mail" for a feedstock page (or the whole site). Signed-in
 * readers follow in one click with their account's address; visitors type an
 * address and confirm from the mailed link (double opt-in). Either way they
 * choose each update as it happens or a weekly digest. Who is asking comes
 * from GET /api/subscriptions through SWR, so the page around it stays
 * cacheable; the write is the server action subscribeToUpdates.
 *
 * Embed: <SubscribePanel feedstockId={f.id} feedstockSlug={f.slug} feedstockName={f.name} />
 */
export function SubscribePanel({ feedstockId, feedstockSlug, feedstockName, headingLevel = 2 }: SubscribePanelProps) {
  const { data, error, mutate } = useSWR(SUBSCRIPTIONS_KEY, fetchSubscriptions, { revalidateOnFocus: true, shouldRetryOnError: false });
  const [state, action, pending] = useActionState<SubscribeFormState, FormData>(subscribeToUpdates, { ok: false });
  const [again, setAgain] = useState(false);
  const name = feedstockName ?? (feedstockId === null ? 'every feedstock' : 'this feedstock');
  const Heading = headingLevel === 2 ? 'h2' : 'h3';
  const idBase = `subscribe-${feedstockId ?? 'site'}`;
  const feedUrl = feedstockSlug ? `/feedstocks/${feedstockSlug}/feed.xml` : '/feed.xml';

  // After a one-click follow, ask again so the panel shows the new subscription.
  useEffect(() => {
    if (state.ok && state.status === 'following') void mutate();
  }, [state, mutate]);

  const current = data?.subscriptions.find((s) => s.feedstockId === feedstockId && s.confirmed);

  let body;
  if (!data && !error) {
    body = <p className="text-ink-muted">Checking whether you already follow {name}…</p>;
  } else if (current && !again) {
    body = (
      <div role="status" className="space-y-2 rounded-md bg-accent-soft p-3">
        <p className="font-semibold text-accent-strong">
          You follow {name}: {MODE_LABELS[current.mode].toLowerCase()}, to {data?.email}.
        </p>
        <p>
          Change how often, or stop, on <Link href="/account#subscriptions-heading">your account page</Link>. Every mail also has a one-click unsubscribe link.
        </p>
      </div>
    );
  } else if (state.ok && state.status === 'confirmation-sent' && !again) {
    body = (
      <div role="status" className="space-y-2 rounded-md border border-accent bg-accent-soft p-3">
        <p className="font-semibold">Check your e-mail</p>
        <p>{state.message}</p>
        <p className="text-sm text-ink-muted">The link works for 72 hours. Nothing arrived? Look in your spam folder, or send another.</p>
        <Button variant="secondary" onClick={() => setAgain(true)}>
          Use another address
        </Button>
      </div>
    );
  } else {
    const oneClick = !!data?.oneClick;
    body = (
      <form
        action={(fd) => {
          setAgain(false);
          action(fd);
        }}
        className="space-y-4"
        noValidate
      >
        <input type="hidden" name="feedstockId" value={feedstockId ?? ''} />
        <ModeChoice name="mode" idBase={idBase} defaultValue="immediate" error={fieldError(state, 'mode')} />
        {oneClick ? (
          <p className="text-sm text-ink-muted">Mail goes to {data?.email}, the address you sign in with.</p>
        ) : (
          <Field
            label="Your e-mail address"
            name="email"
            id={`${idBase}-email`}
            type="email"
            autoComplete="email"
            inputMode="email"
            required
            defaultValue={state.email}
            hint="We mail you a link to confirm; nothing else is sent until you open it. No account needed."
            error={fieldError(state, 'email')}
          />
        )}
        <Button type="submit" size="lg" disabled={pending} className="w-full sm:w-auto">
          {pending ? 'Sending…' : oneClick ? `Follow ${name}` : 'E-mail me a confirmation link'}
        </Button>
        {fieldError(state, 'feedstockId') ? <p className="text-sm font-semibold text-danger">{fieldError(state, 'feedstockId')}</p> : null}
        <FormMessage state={state} />
      </form>
    );
  }

  return (
    <section aria-labelledby={`${idBase}-heading`} className="space-y-3 rounded-lg border border-line bg-surface-raised p-4 sm:p-5">
      <Heading id={`${idBase}-heading`} className="text-2xl">
        Follow {name} by e-mail
      </Heading>
      <p>
        Hear when a verdict is decided, a proposal opens, a new trial is linked or the page text is edited — each mail says what
        changed and why.
      </p>
      {body}
      <p className="text-sm text-ink-muted">
        Prefer a feed reader? <a href={feedUrl}>Atom feed of {name}</a>.
      </p>
    </section>
  );
}
