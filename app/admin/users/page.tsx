import type { Metadata } from 'next';
import Link from 'next/link';
import { redirect } from 'next/navigation';
import { UserAccessControls } from '@/components/admin/user-access-controls';
import { Badge, buttonClasses, Card } from '@/components/ui';
import { getActor } from '@/lib/auth/actor';
import { can, ROLES } from '@/lib/policies';
import { listRecentAccessChanges, listUsers } from '@/lib/queries/accounts';
import { UserListQuerySchema } from '@/lib/validation/accounts';

export const metadata: Metadata = { title: 'Users and roles' };
export const dynamic = 'force-dynamic';

type SearchParams = Promise<Record<string, string | string[] | undefined>>;
const one = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v);

const when = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });
const whenTime = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit', timeZone: 'UTC', timeZoneName: 'short' });

function describeChange(action: string, details: Record<string, unknown>): string {
  switch (action) {
    case 'user.role-change':
      return `role ${String(details.from)} → ${String(details.to)}`;
    case 'user.disable':
      return 'disabled';
    case 'user.enable':
      return 'enabled again';
    case 'licence.accept':
      return 'accepted the contribution licence (reader → contributor)';
    default:
      return action;
  }
}

export default async function AdminUsersPage({ searchParams }: { searchParams: SearchParams }) {
  const actor = await getActor();
  if (!actor) redirect('/signin?callbackUrl=/admin/users');
  if (!can(actor, 'user.manage')) {
    return (
      <div className="mx-auto max-w-prose space-y-4">
        <h1 className="text-4xl">Users and roles</h1>
        <p role="alert" className="text-lg">
          Only admins can change roles and accounts. Your role is {actor.role}.
        </p>
        <p>
          <Link href="/account">Back to your account</Link>
        </p>
      </div>
    );
  }
  const params = await searchParams;
  const parsed = UserListQuerySchema.safeParse({ q: one(params.q), page: one(params.page) });
  const query = parsed.success ? parsed.data : { q: '', page: 1 };
  const [list, changes] = await Promise.all([listUsers(actor, query), listRecentAccessChanges(actor)]);
  const pageHref = (page: number) => `/admin/users?${new URLSearchParams({ ...(list.q ? { q: list.q } : {}), page: String(page) })}`;

  return (
    <div className="space-y-8">
      <header className="max-w-prose space-y-2">
        <h1 className="text-4xl">Users and roles</h1>
        <p>
          New accounts are readers; a reader becomes a contributor by accepting the contribution licence. Editors, moderators and
          admins are chosen here. Every change is written to the audit log. Trialbed always keeps at least one active admin, and
          nobody can disable their own account.
        </p>
      </header>

      <form method="get" action="/admin/users" role="search" className="flex max-w-xl flex-wrap items-end gap-2">
        <div className="flex flex-1 flex-col gap-1">
          <label htmlFor="users-q" className="font-semibold">
            Find by name or e-mail
          </label>
          <input
            id="users-q"
            name="q"
            type="search"
            defaultValue={list.q}
            className="min-h-touch w-full rounded-md border border-line-strong bg-surface-raised px-3 text-base"
          />
        </div>
        <button type="submit" className={buttonClasses('secondary')}>
          Search
        </button>
      </form>

      <section aria-labelledby="users-heading" className="space-y-3">
        <h2 id="users-heading" className="text-2xl">
          {list.total} {list.total === 1 ? 'account' : 'accounts'}
          {list.q ? ` matching “${list.q}”` : ''}
        </h2>
        <ul className="grid list-none gap-3 p-0">
          {list.users.map((u) => (
            <li key={u.id}>
              <Card className="grid gap-3 md:grid-cols-[1fr_auto] md:items-start">
                <div className="min-w-0 space-y-1">
                  <p className="break-all font-semibold">{u.email ?? '(no e-mail)'}</p>
                  <p className="text-ink-muted">{u.name ?? 'No name given'}</p>
                  <p className="flex flex-wrap gap-2">
                    <Badge tone="accent" className="capitalize">
                      {u.role}
                    </Badge>
                    {u.disabled ? <Badge tone="outline">Disabled</Badge> : null}
                    {!u.emailVerified ? <Badge tone="outline">E-mail not confirmed</Badge> : null}
                    {u.isDemo ? <Badge tone="outline">Demo</Badge> : null}
                  </p>
                  <p className="text-sm text-ink-muted">
                    Joined {when.format(new Date(u.joinedAt))}
                    {u.licenceAccepted ? ' · licence accepted' : ' · licence not accepted'}
                  </p>
                </div>
                <UserAccessControls
                  userId={u.id}
                  label={u.email ?? u.id}
                  role={u.role}
                  roles={ROLES}
                  disabled={u.disabled}
                  canDisable={can(actor, 'user.disable', { userId: u.id })}
                />
              </Card>
            </li>
          ))}
        </ul>
        {list.pageCount > 1 ? (
          <nav aria-label="Pages" className="flex items-center gap-3">
            {list.page > 1 ? <Link href={pageHref(list.page - 1)}>Previous page</Link> : null}
            <span>
              Page {list.page} of {list.pageCount}
            </span>
            {list.page < list.pageCount ? <Link href={pageHref(list.page + 1)}>Next page</Link> : null}
          </nav>
        ) : null}
      </section>

      <section aria-labelledby="audit-heading" className="max-w-prose space-y-3">
        <h2 id="audit-heading" className="text-2xl">
          Recent account changes
        </h2>
        {changes.length ? (
          <ol className="list-none space-y-2 p-0">
            {changes.map((c) => (
              <li key={c.id} className="border-b border-line pb-2">
                <span className="font-semibold">{c.subjectEmail ?? 'a deleted account'}</span>: {describeChange(c.action, c.details)}
                <span className="block text-sm text-ink-muted">
                  {whenTime.format(new Date(c.at))}
                  {c.action === 'licence.accept' ? '' : ` by ${c.actorEmail ?? 'an admin'}`}
                </span>
              </li>
            ))}
          </ol>
        ) : (
          <p>No account changes yet.</p>
        )}
      </section>
    </div>
  );
}
