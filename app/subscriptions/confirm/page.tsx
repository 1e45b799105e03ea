import type { Metadata } from 'next';
import Link from 'next/link';
import { TokenActionForm } from '@/components/subscription/token-action-form';
import { MODE_LABELS } from '@/components/subscription/mode-choice';
import { previewConfirmation } from '@/lib/queries/subscriptions';

export const metadata: Metadata = { title: 'Confirm your subscription', robots: { index: false } };
export const dynamic = 'force-dynamic';

type Props = { searchParams: Promise<{ token?: string | string[] }> };

/** Where the confirmation link of a visitor's subscription lands: it shows what is confirmed; the button confirms. */
export default async function ConfirmSubscriptionPage({ searchParams }: Props) {
  const raw = (await searchParams).token;
  const token = typeof raw === 'string' ? raw : '';
  const preview = await previewConfirmation({ token });
  return (
    <div className="mx-auto max-w-prose space-y-6">
      <h1 className="text-4xl">Confirm your subscription</h1>
      {preview ? (
        <>
          <p>
            Follow <strong>{preview.name}</strong> by e-mail ({MODE_LABELS[preview.mode].toLowerCase()}), sent to {preview.maskedEmail}?
          </p>
          <TokenActionForm kind="confirm" token={token} label={`Confirm: follow ${preview.name}`} />
        </>
      ) : (
        <p className="rounded-md border border-line bg-surface-raised p-4">
          This confirmation link does not work any more: it was used already, or it is older than 72 hours. Ask for a new one from
          the page you want to follow — <Link href="/feedstocks">browse feedstocks</Link>.
        </p>
      )}
    </div>
  );
}
