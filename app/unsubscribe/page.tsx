import type { Metadata } from 'next';
import Link from 'next/link';
import { TokenActionForm } from '@/components/subscription/token-action-form';
import { AppError } from '@/lib/errors';
import { previewUnsubscribe, type UnsubscribeOutcome } from '@/lib/queries/subscriptions';

export const metadata: Metadata = { title: 'Unsubscribe', robots: { index: false } };
export const dynamic = 'force-dynamic';

type Props = { searchParams: Promise<{ token?: string | string[] }> };

/**
 * The page behind every mail's unsubscribe link (GET /api/unsubscribe sends
 * people here). Opening it changes nothing; the button unsubscribes. No
 * sign-in needed: the signed token says which subscription.
 */
export default async function UnsubscribePage({ searchParams }: Props) {
  const raw = (await searchParams).token;
  const token = typeof raw === 'string' ? raw : '';
  let preview: UnsubscribeOutcome | null = null;
  try {
    preview = await previewUnsubscribe({ token });
  } catch (err) {
    // A damaged or forged link: say so (the ZodError and ForbiddenError both land here).
    if (!(err instanceof AppError) && !(err instanceof Error && err.name === 'ZodError')) throw err;
  }
  const what = preview?.scopes.join(', ');
  return (
    <div className="mx-auto max-w-prose space-y-6">
      <h1 className="text-4xl">Unsubscribe</h1>
      {!preview ? (
        <p className="rounded-md border border-line bg-surface-raised p-4">
          This unsubscribe link is not valid. Use the link in your newest mail from Trialbed, or{' '}
          <Link href="/account#subscriptions-heading">sign in and manage your subscriptions</Link>.
        </p>
      ) : preview.alreadyUnsubscribed ? (
        <p role="status" className="rounded-md bg-accent-soft p-4 font-semibold text-accent-strong">
          {preview.maskedEmail} is already unsubscribed from {what}. We send no more mail about it.
        </p>
      ) : (
        <>
          <p>
            Stop the e-mail about <strong>{what}</strong> to {preview.maskedEmail}?
          </p>
          <TokenActionForm kind="unsubscribe" token={token} label="Unsubscribe" />
        </>
      )}
    </div>
  );
}
