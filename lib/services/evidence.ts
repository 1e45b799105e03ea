import 'server-only';
import { Op, type Transaction } from 'sequelize';
import { sequelize } from '@/db';
import { CheckIn, EvidenceAggregate, EvidenceVerdict, Feedstock, Photo, Trial } from '@/db/models';
import { aggregateFeedstock, type FeedstockAggregate, type TrialInput } from '@/lib/evidence';
import type { Pest as EnginePest } from '@/lib/evidence/types';
import type { Pest } from '@/db/models/CheckIn';

/** Database pest codes → engine pest codes (the engine says "flatworms" for land flatworms). */
const PEST_TO_ENGINE: Record<Pest, EnginePest> = {
  'land-flatworms': 'flatworms',
  mites: 'mites',
  'fruit-flies': 'fruit-flies',
  'fungus-gnats': 'fungus-gnats',
  ants: 'ants',
  rodents: 'rodents',
  springtails: 'springtails',
};

/** Turns a stored trial with its check-ins into the engine's plain input. */
export function toTrialInput(trial: Trial, checkIns: CheckIn[], photoCount: number): TrialInput {
  return {
    id: String(trial.id),
    contributorId: trial.ownerId,
    setting: trial.setting,
    preparation: trial.preparation,
    status: trial.status,
    startDate: trial.startDate,
    surfaceLoadKgM2: trial.surfaceLoadKgM2,
    layerDepthCm: trial.layerDepthCm,
    feedRatio: trial.feedRatio,
    // A trial with a paired comparison or control plot has a control.
    hasControl: trial.pairedTrialId !== null || trial.isControl,
    photoCount,
    outcomeOverride: trial.status === 'closed' ? trial.confirmedOutcome : null,
    checkIns: checkIns
      .map((c) => ({
        date: c.observedOn,
        wormActivity: c.wormActivity,
        shareRemainingPct: c.shareRemainingPct,
        bedTempC: c.bedTempC,
        mould: c.mould,
        smell: c.smell,
        moisture: c.moisture,
        pH: c.ph,
        pests: (c.pests ?? []).map((p) => PEST_TO_ENGINE[p]).filter(Boolean),
        wormDeaths: c.wormDeaths,
        exodus: c.exodus,
      }))
      .sort((a, b) => a.date.localeCompare(b.date)),
  };
}

/** Loads every trial of a feedstock as engine input (three queries, no N+1). */
export async function loadTrialInputs(feedstockId: number, transaction?: Transaction): Promise<TrialInput[]> {
  const trials = await Trial.findAll({ where: { feedstockId }, order: [['id', 'ASC']], transaction });
  if (!trials.length) return [];
  const ids = trials.map((t) => t.id);
  const [checkIns, photoCounts] = await Promise.all([
    CheckIn.findAll({ where: { trialId: { [Op.in]: ids } }, order: [['observedOn', 'ASC'], ['id', 'ASC']], transaction }),
    Photo.count({ where: { trialId: { [Op.in]: ids } }, group: ['trialId'], transaction }) as unknown as Promise<{ trialId: number; count: number }[]>,
  ]);
  const byTrial = new Map<number, CheckIn[]>();
  for (const c of checkIns) {
    const list = byTrial.get(c.trialId) ?? [];
    list.push(c);
    byTrial.set(c.trialId, list);
  }
  const photos = new Map(photoCounts.map((p) => [Number(p.trialId), Number(p.count)]));
  return trials.map((t) => toTrialInput(t, byTrial.get(t.id) ?? [], photos.get(t.id) ?? 0));
}

/**
 * Recomputes one feedstock's stored evidence from its trials, in one
 * transaction (joins the caller's when given). Locks the feedstock row so two
 * recomputes of the same feedstock cannot interleave. Returns the engine result.
 */
export async function recomputeFeedstock(feedstockId: number, outer?: Transaction): Promise<FeedstockAggregate> {
  const work = async (transaction: Transaction) => {
    await Feedstock.findByPk(feedstockId, { transaction, lock: transaction.LOCK.UPDATE, attributes: ['id'] });
    const inputs = await loadTrialInputs(feedstockId, transaction);
    const result = aggregateFeedstock(inputs);
    const computedAt = new Date();
    await EvidenceAggregate.destroy({ where: { feedstockId }, transaction });
    await EvidenceVerdict.destroy({ where: { feedstockId }, transaction });
    if (result.groups.length) {
      await EvidenceAggregate.bulkCreate(
        result.groups.map((g) => ({
          feedstockId,
          setting: g.setting,
          preparation: g.preparation,
          verdict: g.verdict,
          certainty: g.certainty.grade,
          trialCount: g.counts.trials,
          finishedCount: g.counts.finished,
          contributorCount: g.counts.contributors,
          successRate: g.success.proportion,
          wilsonLow: g.success.lower,
          wilsonHigh: g.success.upper,
          harmRate: g.harm.proportion,
          ceilingKgM2: g.ceiling.kgM2,
          medianDays: g.timeToConsumption.median,
          medianDaysLow: g.timeToConsumption.medianLower,
          medianDaysHigh: g.timeToConsumption.medianUpper,
          result: g,
          rulesVersion: result.rulesVersion,
          computedAt,
        })),
        { transaction },
      );
    }
    if (result.settings.length) {
      await EvidenceVerdict.bulkCreate(
        result.settings.map((s) => ({
          feedstockId,
          setting: s.setting,
          verdict: s.verdict,
          certainty: s.certainty?.grade ?? 'very low',
          ceilingKgM2: s.ceiling.kgM2,
          trialCount: s.counts.trials,
          result: s,
          rulesVersion: result.rulesVersion,
          computedAt,
        })),
        { transaction },
      );
    }
    return result;
  };
  return outer ? work(outer) : sequelize.transaction(work);
}

/** One evidence verdict that changed in a full recompute. */
export interface RecomputeChange {
  slug: string;
  setting: string;
  from: string | null;
  to: string;
}

/**
 * Recomputes every feedstock (after a rules change) and reports which evidence
 * verdicts changed, so the change can be reviewed before readers see it.
 */
export async function recomputeAll(): Promise<{ feedstocks: number; changes: RecomputeChange[] }> {
  const feedstocks = await Feedstock.findAll({ attributes: ['id', 'slug'], order: [['id', 'ASC']] });
  const before = await EvidenceVerdict.findAll({ attributes: ['feedstockId', 'setting', 'verdict'] });
  const old = new Map(before.map((v) => [`${v.feedstockId}:${v.setting}`, v.verdict]));
  const changes: RecomputeChange[] = [];
  for (const f of feedstocks) {
    const result = await recomputeFeedstock(f.id);
    for (const s of result.settings) {
      const prev = old.get(`${f.id}:${s.setting}`) ?? null;
      if (prev !== s.verdict) changes.push({ slug: f.slug, setting: s.setting, from: prev, to: s.verdict });
    }
  }
  return { feedstocks: feedstocks.length, changes };
}
