import type { Metadata } from 'next';
import Link from 'next/link';
import { AccessPage } from '@/components/layout/access-note';
import { RequestDecisionForm } from '@/components/feedstock/review-forms';
import { Table } from '@/components/ui/table';
import { getActor } from '@/lib/auth/actor';
import { formatDate } from '@/lib/format';
import { can } from '@/lib/policies';
import { listFeedstockRequests } from '@/lib/queries/feedstocks';

export const dynamic = 'force-dynamic';

export const metadata: Metadata = { title: 'Requested feedstocks', description: 'Feedstocks readers asked for.', robots: { index: false } };

const STATUS: Record<string, string> = { open: 'Open', added: 'Page made', declined: 'Declined' };

export default async function ReviewRequestsPage() {
  const actor = await getActor();
  if (!can(actor, 'review.view')) {
    return <AccessPage title="Requested feedstocks" actor={actor} who="editors" callbackUrl="/review/requests" />;
  }
  const requests = await listFeedstockRequests();
  const canCreate = can(actor, 'feedstock.create');
  return (
    <div className="space-y-6">
      <h1 className="text-3xl">Requested feedstocks</h1>
      <p className="max-w-prose">
        What readers asked for, open requests first. Also: <Link href="/review/edits">suggested edits</Link>.
      </p>
      <Table caption={`${requests.filter((r) => r.status === 'open').length} open requests`}>
        <thead>
          <tr>
            <th scope="col">Feedstock</th>
            <th scope="col">Note</th>
            <th scope="col">Asked</th>
            <th scope="col">Status</th>
            <th scope="col">Action</th>
          </tr>
        </thead>
        <tbody>
          {requests.map((r) => (
            <tr key={r.id}>
              <th scope="row" className="border-t border-line">{r.name}</th>
              <td className="max-w-md">{r.note ?? <span className="text-ink-muted">—</span>}</td>
              <td className="whitespace-nowrap">{formatDate(r.createdAt)}</td>
              <td>{r.feedstockSlug ? <Link href={`/feedstocks/${r.feedstockSlug}`}>{STATUS[r.status]}</Link> : STATUS[r.status]}</td>
              <td>
                {r.status !== 'added' && canCreate ? (
                  <span className="flex flex-wrap gap-2">
                    {r.status === 'open' ? (
                      <Link href={`/feedstocks/new?name=${encodeURIComponent(r.name)}&requestId=${r.id}`} className="inline-flex min-h-touch items-center">
                        Make a page
                      </Link>
                    ) : null}
                    <RequestDecisionForm requestId={r.id} status={r.status} />
                  </span>
                ) : null}
              </td>
            </tr>
          ))}
        </tbody>
      </Table>
    </div>
  );
}
