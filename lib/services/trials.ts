import 'server-only';
import { sequelize } from '@/db';
import { CheckIn, Feedstock, Trial } from '@/db/models';
import { classifyTrial, normaliseDose, toCelsius, toCm, toKg } from '@/lib/evidence';
import type { DoseQuantity } from '@/lib/evidence/types';
import type { Transaction } from 'sequelize';
import { ConflictError, InvalidInputError, NotFoundError } from '@/lib/errors';
import { authorizeUser, can, type Actor } from '@/lib/policies';
import {
  CheckInCreateSchema,
  TrialCloseSchema,
  TrialCreateSchema,
  TrialUpdateSchema,
  type CheckInCreateInput,
  type TrialCloseInput,
  type TrialCreateInput,
  type TrialUpdateInput,
} from '@/lib/validation/trials';
import { loadTrialInputs, recomputeFeedstock } from './evidence';
import { SETTING_PHRASES } from '@/lib/vocabulary';
import { queueFeedstockEvent } from './notifications';

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
    const paired = input.pairedTrialId ? await resolvePairedTrial(actor, feedstock.id, input.pairedTrialId, null, transaction) : null;
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
    // Pairing is symmetric: the comparison plot points back when it has no partner yet.
    if (paired && paired.pairedTrialId === null) await paired.update({ pairedTrialId: trial.id, version: paired.version + 1 }, { transaction });
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
 * The trial a new or edited trial is paired with (its comparison or control
 * plot): it must exist, be of the same feedstock, not be the trial itself,
 * and be one the actor may update (their own, or any for a moderator).
 * Throws InvalidInputError with a `pairedTrialId` message otherwise.
 */
async function resolvePairedTrial(actor: NonNullable<Actor>, feedstockId: number, pairedId: number, selfId: number | null, transaction: Transaction): Promise<Trial> {
  const paired = await Trial.findByPk(pairedId, { transaction, lock: transaction.LOCK.UPDATE });
  const fail = (msg: string) => new InvalidInputError(undefined, { pairedTrialId: [msg] });
  if (!paired) throw fail('No such trial.');
  if (paired.id === selfId) throw fail('A trial cannot be paired with itself.');
  if (paired.feedstockId !== feedstockId) throw fail('Pair it with a trial of the same feedstock.');
  if (!can(actor, 'trial.update', { ownerId: paired.ownerId })) throw fail('Pair it with one of your own trials.');
  return paired;
}

/**
 * Changes a trial's details (its owner, or a moderator): any subset of the
 * fields entered when it was logged; the feedstock never changes. Loads are
 * normalised again when the dose, area, layer depth or worm mass change, and
 * the feedstock's evidence is recomputed in the same transaction. Throws
 * ConflictError (409) when `version` is stale, InvalidInputError (400) with
 * field messages for bad input (a start after the first check-in, a volume
 * dose without bulk density, a bad pairing), 401/403/404 otherwise.
 */
export async function updateTrial(actor: Actor, trialId: number, raw: unknown): Promise<{ id: number; version: number; surfaceLoadKgM2: number }> {
  const input: TrialUpdateInput = TrialUpdateSchema.parse(raw);
  return sequelize.transaction(async (transaction) => {
    const trial = await Trial.findByPk(trialId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!trial) throw new NotFoundError('No such trial.');
    authorizeUser(actor, 'trial.update', { ownerId: trial.ownerId });
    if (input.version !== trial.version) throw new ConflictError('This trial changed since you opened it. Reload it and make your change again.');
    const changes: Partial<Trial['_creationAttributes']> = {};
    for (const k of ['setting', 'preparation', 'provenance', 'species', 'region', 'checkInEveryDays', 'notes', 'isControl'] as const) {
      if (input[k] !== undefined) (changes as Record<string, unknown>)[k] = input[k];
    }
    if (input.startDate !== undefined && input.startDate !== trial.startDate) {
      const first = await CheckIn.min<string, CheckIn>('observedOn', { where: { trialId: trial.id }, transaction });
      if (first && input.startDate > first) {
        throw new InvalidInputError(undefined, { startDate: [`The start cannot be after the first check-in (${first}).`] });
      }
      changes.startDate = input.startDate;
    }
    if (input.bedDepth !== undefined) changes.bedDepthCm = input.bedDepth ? toCm(input.bedDepth.amount, input.bedDepth.unit) : null;

    const doseChanged = input.dose !== undefined || input.surfaceArea !== undefined;
    if (doseChanged || input.layerDepth !== undefined || input.wormMass !== undefined) {
      const feedstock = await Feedstock.findByPk(trial.feedstockId, { transaction });
      const dose = (input.dose ?? { amount: trial.doseAmount, unit: trial.doseUnit }) as DoseQuantity;
      const isVolume = !['kg', 'g', 'lb', 'oz'].includes(dose.unit);
      if (isVolume && !feedstock?.bulkDensityKgM3) {
        throw new InvalidInputError(undefined, { 'dose.unit': ['This feedstock has no bulk density yet; enter the dose as a mass.'] });
      }
      // A stored layer depth may have been estimated from the old dose: estimate again unless it was given.
      const layerDepth =
        input.layerDepth !== undefined ? input.layerDepth : !doseChanged && trial.layerDepthCm !== null ? { amount: trial.layerDepthCm, unit: 'cm' as const } : null;
      const wormMass = input.wormMass !== undefined ? input.wormMass : trial.wormMassKg !== null ? { amount: trial.wormMassKg, unit: 'kg' as const } : null;
      const loads = normaliseDose({
        dose,
        area: input.surfaceArea ?? { amount: trial.surfaceAreaM2, unit: 'm2' },
        bulkDensityKgM3: feedstock?.bulkDensityKgM3 ?? null,
        layerDepth: layerDepth ?? null,
        wormMass: wormMass ?? null,
      });
      Object.assign(changes, {
        surfaceAreaM2: loads.areaM2,
        doseAmount: dose.amount,
        doseUnit: dose.unit,
        doseKg: loads.massKg,
        surfaceLoadKgM2: loads.surfaceLoadKgM2,
        layerDepthCm: loads.layerDepthCm,
        wormMassKg: wormMass ? toKg(wormMass.amount, wormMass.unit) : null,
        feedRatio: loads.feedRatio,
      });
    }
    if (input.pairedTrialId !== undefined && input.pairedTrialId !== trial.pairedTrialId) {
      const paired = input.pairedTrialId ? await resolvePairedTrial(actor, trial.feedstockId, input.pairedTrialId, trial.id, transaction) : null;
      changes.pairedTrialId = paired?.id ?? null;
      if (paired && paired.pairedTrialId === null) await paired.update({ pairedTrialId: trial.id, version: paired.version + 1 }, { transaction });
    }
    changes.version = trial.version + 1;
    await trial.update(changes, { transaction });
    await recomputeFeedstock(trial.feedstockId, transaction);
    return { id: trial.id, version: trial.version, surfaceLoadKgM2: trial.surfaceLoadKgM2 };
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

