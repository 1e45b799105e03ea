import { LinkButton } from '@/components/ui/link-button';
import type { Actor } from '@/lib/policies';

/** What a visitor sees on a page their role does not open: sign in, or who may use it. */
export function AccessNote({ actor, who, callbackUrl }: { actor: Actor; who: string; callbackUrl: string }) {
  return (
    <section aria-labelledby="access-heading" className="max-w-prose space-y-3 rounded-lg border border-line bg-surface-raised p-4">
      <h2 id="access-heading" className="text-xl">
        {actor ? `For ${who} only` : 'Sign in first'}
      </h2>
      <p>{actor ? `This page is for ${who}. Ask an admin if you help run the site.` : `This page is for ${who}. Sign in to continue.`}</p>
      {actor ? null : <LinkButton href={`/signin?callbackUrl=${encodeURIComponent(callbackUrl)}`}>Sign in</LinkButton>}
    </section>
  );
}

/** A whole page for a visitor whose role does not open it: the page's title, then the access note. */
export function AccessPage({ title, actor, who, callbackUrl }: { title: string; actor: Actor; who: string; callbackUrl: string }) {
  return (
    <div className="space-y-6">
      <h1 className="text-3xl">{title}</h1>
      <AccessNote actor={actor} who={who} callbackUrl={callbackUrl} />
    </div>
  );
}
