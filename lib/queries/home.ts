import 'server-only';
import { Op } from 'sequelize';
import { Feedstock, VerdictHistory } from '@/db/models';
import type { RecentDecision } from '@/components/layout/home-sections';

/** The newest published-verdict changes that came from decided proposals. */
export async function listRecentDecisions(limit = 6): Promise<RecentDecision[]> {
  const rows = await VerdictHistory.findAll({
    where: { proposalId: { [Op.ne]: null } },
    order: [['decidedAt', 'DESC'], ['id', 'DESC']],
    limit,
  });
  if (!rows.length) return [];
  const feedstocks = await Feedstock.findAll({ where: { id: [...new Set(rows.map((r) => r.feedstockId))] }, attributes: ['id', 'slug', 'name'] });
  const byId = new Map(feedstocks.map((f) => [f.id, f]));
  return rows.map((r) => ({
    proposalId: r.proposalId!,
    feedstockName: byId.get(r.feedstockId)?.name ?? 'Unknown feedstock',
    feedstockSlug: byId.get(r.feedstockId)?.slug ?? '',
    setting: r.setting,
    from: r.previousVerdict,
    to: r.verdict,
    decidedAt: r.decidedAt.toISOString(),
  }));
}
