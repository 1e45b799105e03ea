import 'server-only';
import { Op, QueryTypes, type WhereOptions } from 'sequelize';
import { sequelize } from '@/db';
import { Feedstock, FeedstockRedirect, FeedstockRevision, Proposal, Trial, VerdictHistory } from '@/db/models';
import { SETTING_PHRASES, SETTING_PLURALS, VERDICT_LABELS } from '@/lib/vocabulary';

/**
 * Entries of the Atom feeds (RFC 4287): verdict decisions, proposals opened,
 * trials linked and page edits — of one feedstock, or of the whole site.
 * Privacy: no e-mail addresses, no names of people, no trial regions or
 * notes; a trial is described by its setting, preparation and load only.
 */

/** One feed entry; `key` is unique and stable (it becomes the entry's id). */
export type FeedEntryDTO = {
  key: string;
  kind: 'verdict-decided' | 'proposal-opened' | 'trial-linked' | 'page-edited';
  title: string;
  summary: string;
  /** The page the entry is about, a path on this site ("/proposals/12"). */
  path: string;
  updated: string;
  feedstock: { slug: string; name: string };
};

/** A feed: its feedstock (null for the site), newest entries first, and its newest entry's time. */
export type FeedDTO = { feedstock: { id: number; slug: string; name: string } | null; entries: FeedEntryDTO[]; updated: string | null };

/** How many entries a feed carries (newest first). */
export const FEED_LIMIT = 50;

const fmtLoad = (kgM2: number) => `${Number(Number(kgM2).toPrecision(3))} kg/m²`;

/**
 * The newest FEED_LIMIT entries of one feedstock (`feedstockId`), or of every
 * feedstock (null). Four bounded queries plus two lookups, whatever the size of
 * the site. Hidden proposals and merged feedstocks' own pages are left out.
 */
export async function getFeed(feedstockId: number | null, limit = FEED_LIMIT): Promise<FeedDTO> {
  let feedstock: FeedDTO['feedstock'] = null;
  if (feedstockId !== null) {
    const f = await Feedstock.findByPk(feedstockId, { attributes: ['id', 'slug', 'name'] });
    if (!f) return { feedstock: null, entries: [], updated: null };
    feedstock = { id: f.id, slug: f.slug, name: f.name };
  }
  const byFeedstock: WhereOptions = feedstockId === null ? {} : { feedstockId };
  const [decided, opened, trials, edits] = await Promise.all([
    Proposal.findAll({
      where: { ...byFeedstock, status: ['approved', 'rejected'], decidedAt: { [Op.ne]: null }, hiddenAt: null },
      attributes: ['id', 'feedstockId', 'status', 'settings', 'decidedAt', 'isDemo'],
      order: [['decidedAt', 'DESC'], ['id', 'DESC']],
      limit,
    }),
    Proposal.findAll({
      where: { ...byFeedstock, hiddenAt: null },
      attributes: ['id', 'feedstockId', 'settings', 'createdAt', 'isDemo'],
      order: [['createdAt', 'DESC'], ['id', 'DESC']],
      limit,
    }),
    Trial.findAll({
      where: byFeedstock,
      attributes: ['id', 'feedstockId', 'setting', 'preparation', 'surfaceLoadKgM2', 'createdAt', 'isDemo'],
      order: [['createdAt', 'DESC'], ['id', 'DESC']],
      limit,
    }),
    FeedstockRevision.findAll({
      where: { ...byFeedstock, status: 'published' },
      attributes: ['id', 'feedstockId', 'editSummary', 'baseVersion', 'createdAt', 'reviewedAt'],
      order: [['createdAt', 'DESC'], ['id', 'DESC']],
      limit,
    }),
  ]);
  const decidedIds = decided.map((p) => p.id);
  const openedIds = opened.map((p) => p.id);
  const [history, citations] = await Promise.all([
    decidedIds.length ? VerdictHistory.findAll({ where: { proposalId: decidedIds }, attributes: ['proposalId', 'setting', 'previousVerdict', 'verdict'] }) : [],
    openedIds.length || decidedIds.length
      ? sequelize.query<{ proposal_id: number; n: number }>('SELECT proposal_id, COUNT(*) AS n FROM proposal_trials WHERE proposal_id IN (:ids) GROUP BY proposal_id', {
          replacements: { ids: [...new Set([...openedIds, ...decidedIds])] },
          type: QueryTypes.SELECT,
        })
      : [],
  ]);
  const cited = new Map(citations.map((c) => [Number(c.proposal_id), Number(c.n)]));
  const changes = new Map<number, string[]>();
  for (const h of history) {
    const line = `${h.previousVerdict ? `${VERDICT_LABELS[h.previousVerdict]} → ` : ''}${VERDICT_LABELS[h.verdict]} in ${SETTING_PLURALS[h.setting]}`;
    changes.set(h.proposalId!, [...(changes.get(h.proposalId!) ?? []), line]);
  }

  let names = new Map<number, { slug: string; name: string }>();
  if (feedstock) names.set(feedstock.id, { slug: feedstock.slug, name: feedstock.name });
  else {
    const ids = [...new Set([...decided, ...opened, ...trials, ...edits].map((r) => r.feedstockId))];
    const rows = ids.length ? await Feedstock.findAll({ where: { id: ids }, attributes: ['id', 'slug', 'name'] }) : [];
    names = new Map(rows.map((f) => [f.id, { slug: f.slug, name: f.name }]));
  }
  const demo = (isDemo: boolean) => (isDemo ? ' (demo data)' : '');
  const citing = (id: number) => {
    const n = cited.get(id) ?? 0;
    return n ? `, citing ${n} trial${n === 1 ? '' : 's'}` : '';
  };

  const entries: FeedEntryDTO[] = [];
  for (const p of decided) {
    const f = names.get(p.feedstockId);
    if (!f) continue;
    const what = p.status === 'approved' ? (changes.get(p.id)?.join('; ') ?? 'The published verdict changed') : null;
    entries.push({
      key: `proposal-${p.id}-decided`,
      kind: 'verdict-decided',
      title: p.status === 'approved' ? `Verdict decided for ${f.name}: ${what}` : `Proposal ${p.id} for ${f.name} not accepted`,
      summary:
        p.status === 'approved'
          ? `${what}, after proposal ${p.id}${citing(p.id)}.${demo(p.isDemo)}`
          : `A moderator did not accept proposal ${p.id}; the published verdict of ${f.name} stays as it was.${demo(p.isDemo)}`,
      path: `/proposals/${p.id}`,
      updated: p.decidedAt!.toISOString(),
      feedstock: f,
    });
  }
  for (const p of opened) {
    const f = names.get(p.feedstockId);
    if (!f) continue;
    const suggests = p.settings.map((s) => `${VERDICT_LABELS[s.verdict]} in ${SETTING_PLURALS[s.setting]}`).join('; ');
    entries.push({
      key: `proposal-${p.id}-opened`,
      kind: 'proposal-opened',
      title: `Proposal ${p.id} opened for ${f.name}: ${suggests}`,
      summary: `Proposal ${p.id} suggests ${suggests}${citing(p.id)}. Contributors vote on it and a moderator decides.${demo(p.isDemo)}`,
      path: `/proposals/${p.id}`,
      updated: p.createdAt.toISOString(),
      feedstock: f,
    });
  }
  for (const t of trials) {
    const f = names.get(t.feedstockId);
    if (!f) continue;
    entries.push({
      key: `trial-${t.id}`,
      kind: 'trial-linked',
      title: `New trial of ${f.name} in ${SETTING_PHRASES[t.setting]} (${t.preparation})`,
      summary: `Trial ${t.id}: ${t.preparation} ${f.name.toLowerCase()} in ${SETTING_PHRASES[t.setting]}, ${fmtLoad(t.surfaceLoadKgM2)} at once.${demo(t.isDemo)}`,
      path: `/trials/${t.id}`,
      updated: t.createdAt.toISOString(),
      feedstock: f,
    });
  }
  for (const r of edits) {
    const f = names.get(r.feedstockId);
    if (!f) continue;
    entries.push({
      key: `revision-${r.id}`,
      kind: 'page-edited',
      title: `Page of ${f.name} edited${r.editSummary ? `: ${r.editSummary}` : ''}`,
      summary: `Version ${r.baseVersion + 1} of the page text of ${f.name} was published${r.editSummary ? ` (“${r.editSummary}”)` : ''}.`,
      path: `/feedstocks/${f.slug}/history`,
      updated: (r.reviewedAt ?? r.createdAt).toISOString(),
      feedstock: f,
    });
  }
  entries.sort((a, b) => (a.updated < b.updated ? 1 : a.updated > b.updated ? -1 : a.key.localeCompare(b.key)));
  const top = entries.slice(0, limit);
  return { feedstock, entries: top, updated: top[0]?.updated ?? null };
}

/** A feedstock by slug (its feed and subscribe pages): `{ id }`, `{ redirectTo }` for an old or merged slug, or null. */
export async function resolveFeedFeedstock(slug: string): Promise<{ id: number } | { redirectTo: string } | null> {
  const f = await Feedstock.findOne({ where: { slug }, attributes: ['id', 'mergedIntoId'] });
  if (f && !f.mergedIntoId) return { id: f.id };
  const r = f?.mergedIntoId ? { feedstockId: f.mergedIntoId } : await FeedstockRedirect.findOne({ where: { oldSlug: slug }, attributes: ['feedstockId'] });
  const target = r ? await Feedstock.findByPk(r.feedstockId, { attributes: ['slug', 'mergedIntoId'] }) : null;
  return target && !target.mergedIntoId ? { redirectTo: target.slug } : null;
}
