import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import type { ReactNode } from 'react';
import { getEnv, isMailboxEnabled } from '@/lib/env';
import { listCapturedMail, mailboxDir } from '@/lib/mail/mailbox';

export const metadata: Metadata = { title: 'Local mailbox', robots: { index: false } };
export const dynamic = 'force-dynamic';

const whenTime = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'medium', timeZone: 'UTC' });

/** Plain text with its http(s) links made clickable; nothing else is interpreted. */
function linkify(text: string): ReactNode[] {
  return text.split(/(https?:\/\/[^\s<>"]+)/g).map((part, i) =>
    i % 2 === 1 ? (
      <a key={i} href={part} className="break-all">
        {part}
      </a>
    ) : (
      part
    ),
  );
}

/**
 * Development only: the mail caught by the local capture SMTP server, newest
 * first, so someone running Trialbed on their machine can open a sign-in
 * link. 404 unless demo mode (TRIALBED_DEMO=1) or MAILBOX=1 is on.
 */
export default function MailboxPage() {
  if (!isMailboxEnabled()) notFound();
  const mails = listCapturedMail(mailboxDir(getEnv().DATA_DIR), { limit: 50 });
  return (
    <div className="mx-auto max-w-prose space-y-6">
      <header className="space-y-2">
        <h1 className="text-4xl">Local mailbox</h1>
        <p>
          Mail sent by this copy of Trialbed is caught by a capture server on this machine and shown here instead of being
          delivered. This page exists only in demo mode or with <code>MAILBOX=1</code>; a real site sends mail through its
          provider and has no such page.
        </p>
      </header>
      {mails.length === 0 ? (
        <p className="rounded-lg border border-line bg-surface-raised p-4">No mail yet. Ask for a sign-in link and reload this page.</p>
      ) : (
        <ol className="list-none space-y-4 p-0">
          {mails.map((m) => (
            <li key={m.id}>
              <article aria-labelledby={`mail-${m.id}`} className="space-y-2 rounded-lg border border-line bg-surface-raised p-4">
                <h2 id={`mail-${m.id}`} className="text-xl">
                  {m.subject || '(no subject)'}
                </h2>
                <p className="text-sm text-ink-muted">
                  To {m.to.join(', ')} · {whenTime.format(new Date(m.receivedAt))} UTC
                </p>
                <pre className="whitespace-pre-wrap break-words font-sans text-base">{linkify(m.text)}</pre>
              </article>
            </li>
          ))}
        </ol>
      )}
    </div>
  );
}
