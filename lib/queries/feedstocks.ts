import 'server-only';
import { Op, QueryTypes } from 'sequelize';
import { sequelize } from '@/db';
import { EvidenceVerdict, Feedstock, PublishedVerdict } from '@/db/models';
import type { Category } from '@/db/models/Feedstock';
import type { Certainty, Verdict } from '@/db/models/EvidenceAggregate';
import type { Setting } from '@/db/models/Trial';

/** One row of the feedstock index. */
export interface FeedstockIndexRow {
  slug: string;
  name: string;
  category: Category;
  family: string | null;
  published: Partial<Record<Setting, Verdict>>;
  evidence: Partial<Record<Setting, { verdict: Verdict; certainty: Certainty }>>;
  trialCount: number;
  lastChange: string;
}

/**
 * The feedstock index: every feedstock (merged ones excluded) with its
 * published verdict and evidence verdict per setting and its trial count.
 * Three queries whatever the number of feedstocks.
 */
export async function listFeedstocks(opts: { category?: Category | null } = {}): Promise<FeedstockIndexRow[]> {
  const where = { mergedIntoId: null, ...(opts.category ? { category: opts.category } : {}) };
  const feedstocks = await Feedstock.findAll({
    where,
    attributes: ['id', 'slug', 'name', 'category', 'family', 'updatedAt'],
    order: [['name', 'ASC']],
  });
  const ids = feedstocks.map((f) => f.id);
  if (!ids.length) return [];
  const [published, evidence, counts] = await Promise.all([
    PublishedVerdict.findAll({ where: { feedstockId: { [Op.in]: ids } }, attributes: ['feedstockId', 'setting', 'verdict', 'publishedAt'] }),
    EvidenceVerdict.findAll({ where: { feedstockId: { [Op.in]: ids } }, attributes: ['feedstockId', 'setting', 'verdict', 'certainty'] }),
    sequelize.query<{ feedstock_id: number; n: number; last: string | null }>(
      'SELECT feedstock_id, COUNT(*) AS n, MAX(updated_at) AS last FROM trials WHERE feedstock_id IN (:ids) GROUP BY feedstock_id',
      { replacements: { ids }, type: QueryTypes.SELECT },
    ),
  ]);
  const rows = new Map<number, FeedstockIndexRow>();
  for (const f of feedstocks) {
    rows.set(f.id, {
      slug: f.slug,
      name: f.name,
      category: f.category,
      family: f.family,
      published: {},
      evidence: {},
      trialCount: 0,
      lastChange: f.updatedAt.toISOString(),
    });
  }
  const bump = (row: FeedstockIndexRow, when: Date | string | null) => {
    if (!when) return;
    const iso = new Date(when).toISOString();
    if (iso > row.lastChange) row.lastChange = iso;
  };
  for (const p of published) {
    const row = rows.get(p.feedstockId)!;
    row.published[p.setting] = p.verdict;
    bump(row, p.publishedAt);
  }
  for (const e of evidence) rows.get(e.feedstockId)!.evidence[e.setting] = { verdict: e.verdict, certainty: e.certainty };
  for (const c of counts) {
    const row = rows.get(Number(c.feedstock_id))!;
    row.trialCount = Number(c.n);
    bump(row, c.last);
  }
  return [...rows.values()];
}
