import 'server-only';
import { sequelize } from '@/db';
import { CheckIn, Feedstock, Trial } from '@/db/models';
import { classifyTrial, normaliseDose, toCelsius, toCm, toKg } from '@/lib/evidence';
import type { DoseQuantity } from '@/lib/evidence/types';
import { InvalidInputError, NotFoundError } from '@/lib/errors';
import { authorizeUser, type Actor } from '@/lib/policies';
import {
  CheckInCreateSchema,
  TrialCloseSchema,
  TrialCreateSchema,
  type CheckInCreateInput,
  type TrialCloseInput,
  type TrialCreateInput,
} from '@/lib/validation/trials';
import { loadTrialInputs, recomputeFeedstock } from './evidence';
import { queueFeedstockEvent } from './notifications';

const SETTING_PHRASES: Record<string, string> = { bin: 'an enclosed bin', 'flow-through': 'a flow-through system', bed: 'an open bed' };
const formatLoad = (kgM2: number) => `${Number(kgM2.toPrecision(3))} kg/m²`;

/**
 * Logs a new trial for a contributor, recomputes the feedstock's evidence and
 * queues 'trial-linked' mail for its subscribers, all in the same transaction. Throws InvalidInputError (400, field messages) for
 * bad input or an unknown feedstock; nothing is stored then.
 */
export async function createTrial(actor: Actor, raw: unknown): Promise<{ id: number; feedstockId: number; surfaceLoadKgM2: number }> {
  authorizeUser(actor, 'trial.create');
  const input: TrialCreateInput = TrialCreateSchema.parse(raw);
  return sequelize.transaction(async (transaction) => {
    const feedstock = await Feedstock.findByPk(input.feedstockId, { transaction });
    if (!feedstock || feedstock.mergedIntoId) throw new InvalidInputError(undefined, { feedstockId: ['No such feedstock.'] });
    const isVolume = !['kg', 'g', 'lb', 'oz'].includes(input.dose.unit);
    if (isVolume && !feedstock.bulkDensityKgM3) {
      throw new InvalidInputError(undefined, { 'dose.unit': ['This feedstock has no bulk density yet; enter the dose as a mass.'] });
    }
    if (input.pairedTrialId) {
      const paired = await Trial.findByPk(input.pairedTrialId, { transaction });
      if (!paired) throw new InvalidInputError(undefined, { pairedTrialId: ['No such trial.'] });
    }
    const loads = normaliseDose({
      dose: input.dose as DoseQuantity,
      area: input.surfaceArea,
      bulkDensityKgM3: feedstock.bulkDensityKgM3,
      layerDepth: input.layerDepth ?? null,
      wormMass: input.wormMass ?? null,
    });
    const trial = await Trial.create(
      {
        feedstockId: feedstock.id,
        ownerId: actor.id,
        setting: input.setting,
        preparation: input.preparation,
        provenance: input.provenance,
        surfaceAreaM2: loads.areaM2,
        bedDepthCm: input.bedDepth ? toCm(input.bedDepth.amount, input.bedDepth.unit) : null,
        species: input.species,
        wormMassKg: input.wormMass ? toKg(input.wormMass.amount, input.wormMass.unit) : null,
        doseAmount: input.dose.amount,
        doseUnit: input.dose.unit,
        doseKg: loads.massKg,
        surfaceLoadKgM2: loads.surfaceLoadKgM2,
        layerDepthCm: loads.layerDepthCm,
        feedRatio: loads.feedRatio,
        pairedTrialId: input.pairedTrialId ?? null,
        isControl: input.isControl,
        region: input.region,
        startDate: input.startDate,
        checkInEveryDays: input.checkInEveryDays,
        notes: input.notes,
      },
      { transaction },
    );
    await recomputeFeedstock(feedstock.id, transaction);
    // Subscribers hear of the new evidence; the row commits with the trial or not at all.
    // No region, owner or notes in the mail: only what the feed shows too.
    await queueFeedstockEvent(transaction, {
      kind: 'trial-linked',
      eventId: `trial-${trial.id}`,
      feedstockId: feedstock.id,
      payload: {
        trialId: trial.id,
        feedstockSlug: feedstock.slug,
        feedstockName: feedstock.name,
        setting: input.setting,
        preparation: input.preparation,
        surfaceLoadKgM2: loads.surfaceLoadKgM2,
        summary: `Trial ${trial.id}: ${input.preparation} ${feedstock.name.toLowerCase()} in ${SETTING_PHRASES[input.setting]}, ${formatLoad(loads.surfaceLoadKgM2)} at once`,
      },
    });
    return { id: trial.id, feedstockId: feedstock.id, surfaceLoadKgM2: loads.surfaceLoadKgM2 };
  });
}

/**
 * Adds a check-in to a running trial (its owner, or a moderator) and
 * recomputes the feedstock's evidence in the same transaction. A check-in
 * dated before the trial's start is refused with a field message.
 */
export async function addCheckIn(actor: Actor, trialId: number, raw: unknown): Promise<{ id: number; trialId: number }> {
  const input: CheckInCreateInput = CheckInCreateSchema.parse(raw);
  return sequelize.transaction(async (transaction) => {
    const trial = await Trial.findByPk(trialId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!trial) throw new NotFoundError('No such trial.');
    authorizeUser(actor, 'check-in.create', { ownerId: trial.ownerId });
    if (trial.status !== 'running') throw new InvalidInputError('This trial is closed.', { _form: ['This trial is closed; reopen it to add check-ins.'] });
    if (input.observedOn < trial.startDate) {
      throw new InvalidInputError(undefined, { observedOn: [`A check-in cannot be before the trial started (${trial.startDate}).`] });
    }
    const checkIn = await CheckIn.create(
      {
        trialId: trial.id,
        authorId: actor.id,
        observedOn: input.observedOn,
        utcOffsetMinutes: input.utcOffsetMinutes,
        wormActivity: input.wormActivity,
        shareRemainingPct: input.shareRemainingPct,
        bedTempC: input.bedTemp ? Math.round(toCelsius(input.bedTemp.value, input.bedTemp.unit) * 100) / 100 : null,
        mould: input.mould,
        smell: input.smell,
        moisture: input.moisture,
        ph: input.ph ?? null,
        pests: input.pests,
        wormDeaths: input.wormDeaths,
        exodus: input.exodus,
        notes: input.notes,
      },
      { transaction },
    );
    await trial.increment('version', { transaction });
    await recomputeFeedstock(trial.feedstockId, transaction);
    return { id: checkIn.id, trialId: trial.id };
  });
}

/**
 * Closes (or abandons) a trial. The engine proposes the outcome from the
 * check-ins; the owner confirms it or corrects it, and a correction needs a
 * reason. Recomputes the feedstock's evidence in the same transaction.
 */
export async function closeTrial(actor: Actor, trialId: number, raw: unknown): Promise<{ id: number; proposedOutcome: string | null; confirmedOutcome: string | null }> {
  const input: TrialCloseInput = TrialCloseSchema.parse(raw);
  return sequelize.transaction(async (transaction) => {
    const trial = await Trial.findByPk(trialId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!trial) throw new NotFoundError('No such trial.');
    authorizeUser(actor, 'trial.close', { ownerId: trial.ownerId });
    if (trial.status !== 'running') throw new InvalidInputError('This trial is already closed.', { _form: ['This trial is already closed.'] });
    const inputs = await loadTrialInputs(trial.feedstockId, transaction);
    const mine = inputs.find((t) => t.id === String(trial.id))!;
    const proposed = classifyTrial({ ...mine, status: 'closed', outcomeOverride: null }).outcome;
    const confirmed = input.status === 'abandoned' ? null : (input.outcome ?? proposed);
    if (input.status === 'closed' && !confirmed) {
      throw new InvalidInputError(undefined, { outcome: ['The check-ins do not settle an outcome; choose one.'] });
    }
    if (input.status === 'closed' && confirmed !== proposed && input.reason.length < 5) {
      throw new InvalidInputError(undefined, { reason: ['Say why you are correcting the proposed outcome.'] });
    }
    await trial.update(
      {
        status: input.status,
        proposedOutcome: proposed,
        confirmedOutcome: confirmed,
        closeReason: input.reason || null,
        closedAt: new Date(),
        version: trial.version + 1,
      },
      { transaction },
    );
    await recomputeFeedstock(trial.feedstockId, transaction);
    return { id: trial.id, proposedOutcome: proposed, confirmedOutcome: confirmed };
  });
}

