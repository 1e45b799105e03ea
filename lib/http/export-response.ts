import { NextResponse } from 'next/server';
import { CONTENT_LICENCE } from '@/lib/licence';
import { toCsv } from '@/lib/csv';
import { NotFoundError } from '@/lib/errors';
import { CHECK_IN_EXPORT_COLUMNS, listTrialsForExport, TRIAL_EXPORT_COLUMNS } from '@/lib/queries/trials';
import { ExportQuerySchema } from '@/lib/validation/trials';
import { errorResponse } from './respond';

/** What every export says about its contributors (README, "Export"). */
export const CONTRIBUTOR_NOTE =
  'Contributors appear as a stable pseudonymous label (the same label for the same account, in every export); no names, e-mail addresses or account ids. Locations are regions only.';

/** The `Link` header naming the content licence (RFC 8288 rel="license"). */
export const LICENCE_LINK = `<${CONTENT_LICENCE.url}>; rel="license"`;

/**
 * The trials export (one feedstock's, or the whole site's when `feedstockSlug`
 * is undefined) as CSV (RFC 4180) or JSON. `format` comes from the route
 * (`export.csv`) or the query (`?format=`); `?table=check-ins` gives the
 * check-ins table in CSV. The licence is in the file name, the `Link` header
 * and the JSON body.
 */
export async function exportResponse(request: Request, opts: { feedstockSlug?: string; format?: 'csv' | 'json' }): Promise<Response> {
  try {
    const params = Object.fromEntries(new URL(request.url).searchParams);
    const query = ExportQuerySchema.parse({ ...params, ...(opts.format ? { format: opts.format } : {}) });
    const data = await listTrialsForExport(opts.feedstockSlug);
    if (!data) throw new NotFoundError('No such feedstock.');
    const scope = opts.feedstockSlug ?? 'all';
    const licenceTag = 'cc-by-sa-4.0';
    const common = {
      Link: LICENCE_LINK,
      'Cache-Control': 'public, max-age=60',
      'X-Content-Type-Options': 'nosniff',
    };
    if (query.format === 'csv') {
      const csv =
        query.table === 'check-ins'
          ? toCsv(
              CHECK_IN_EXPORT_COLUMNS,
              data.checkIns.map((c) => ({ ...c, pests: c.pests.join(';') })),
            )
          : toCsv(TRIAL_EXPORT_COLUMNS, data.trials);
      const name = `trialbed-${scope}-${query.table}-${licenceTag}.csv`;
      return new Response(csv, {
        status: 200,
        headers: { ...common, 'Content-Type': 'text/csv; charset=utf-8; header=present', 'Content-Disposition': `attachment; filename="${name}"` },
      });
    }
    const byTrial = new Map<number, typeof data.checkIns>();
    for (const c of data.checkIns) {
      const list = byTrial.get(c.trial_id as number) ?? [];
      list.push(c);
      byTrial.set(c.trial_id as number, list);
    }
    const body = {
      licence: { name: CONTENT_LICENCE.name, url: CONTENT_LICENCE.url },
      attribution: 'Trialbed contributors',
      generatedAt: new Date().toISOString(),
      scope: opts.feedstockSlug ? { feedstock: opts.feedstockSlug } : 'all',
      contributors: CONTRIBUTOR_NOTE,
      trials: data.trials.map((t) => ({ ...t, check_ins: byTrial.get(t.trial_id as number) ?? [] })),
    };
    return NextResponse.json(body, {
      headers: { ...common, 'Content-Disposition': `inline; filename="trialbed-${scope}-trials-${licenceTag}.json"` },
    });
  } catch (err) {
    return errorResponse(err);
  }
}
