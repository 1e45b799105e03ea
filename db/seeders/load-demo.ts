import 'server-only';
import { Op, UniqueConstraintError, type InferCreationAttributes, type Transaction } from 'sequelize';
import { sequelize } from '../index';
import {
  AppMeta,
  CheckIn,
  Feedstock,
  FeedstockAlias,
  FeedstockRequest,
  FeedstockRevision,
  Photo,
  Proposal,
  ProposalTrial,
  PublishedVerdict,
  Subscription,
  Trial,
  User,
  VerdictHistory,
  Vote,
} from '../models';
import { normaliseDose } from '@/lib/evidence/normalise';
import type { DoseQuantity } from '@/lib/evidence/types';
import { recomputeFeedstock } from '@/lib/services/evidence';
import { getStorage, type Storage } from '@/lib/storage';
import { renderPlaceholderPhoto } from './demo-photos';
import {
  DEMO_FEEDSTOCKS,
  DEMO_PEOPLE,
  DEMO_PROPOSALS,
  DEMO_REQUESTS,
  DEMO_SITES,
  DEMO_SUBSCRIPTIONS,
  DEMO_TRIALS,
  type DemoTrial,
} from './demo-scenario';

/** The app_meta key that records that the demo scenario is in this database. */
export const DEMO_MARKER = 'demo_loaded_at';

/** When the demo's published verdicts are dated (before any demo proposal). */
const DEMO_PUBLISHED_AT = new Date('2026-01-15T09:00:00Z');

/**
 * Loads the invented demo scenario once. Everything is written in one
 * transaction that starts by inserting the marker row, so a second run (or a
 * concurrent one) adds nothing. Returns what was added.
 */
export async function loadDemoScenario(opts: { storage?: Storage } = {}): Promise<{ loaded: boolean; counts: Record<string, number> }> {
  if (await AppMeta.findByPk(DEMO_MARKER)) return { loaded: false, counts: {} };
  try {
    return await sequelize.transaction(async (transaction) => {
      // The marker goes first: a concurrent loader blocks on it, then fails on the duplicate key.
      await AppMeta.create({ key: DEMO_MARKER, value: new Date().toISOString() }, { transaction });

      const people = new Map<string, User>();
      for (const p of DEMO_PEOPLE) {
        const u = await User.create(
          {
            name: p.name,
            email: p.email,
            emailVerified: new Date(p.joinedAt),
            role: p.role,
            region: p.region,
            licenceAcceptedAt: p.role === 'reader' ? null : new Date(p.joinedAt),
            isDemo: true,
            createdAt: new Date(p.joinedAt),
          },
          { transaction },
        );
        people.set(p.key, u);
      }
      const editor = [...people.values()].find((u) => u.role === 'editor') ?? null;
      const moderator = [...people.values()].find((u) => u.role === 'moderator') ?? null;

      const feedstocks = new Map<string, Feedstock>();
      for (const f of DEMO_FEEDSTOCKS) {
        const row = await Feedstock.create(
          {
            slug: f.slug,
            name: f.name,
            category: f.category,
            family: f.family,
            cnRatio: f.cnRatio,
            nitrogenPct: f.nitrogenPct,
            moisturePct: f.moisturePct,
            bulkDensityKgM3: f.bulkDensityKgM3,
            referenceSource: f.referenceSource,
            summary: f.summary,
            pageText: f.pageText,
            handlingCautions: f.handlingCautions,
            isDemo: true,
          },
          { transaction },
        );
        feedstocks.set(f.slug, row);
        if (f.aliases.length) {
          await FeedstockAlias.bulkCreate(
            f.aliases.map((alias) => ({ feedstockId: row.id, alias })),
            { transaction },
          );
        }
        await FeedstockRevision.create(
          {
            feedstockId: row.id,
            authorId: editor?.id ?? null,
            body: f.pageText,
            editSummary: 'First version of the page',
            status: 'published',
            baseVersion: 0,
            reviewerId: editor?.id ?? null,
            reviewedAt: DEMO_PUBLISHED_AT,
            createdAt: DEMO_PUBLISHED_AT,
          },
          { transaction },
        );
        for (const pv of f.published) {
          await PublishedVerdict.create(
            {
              feedstockId: row.id,
              setting: pv.setting,
              verdict: pv.verdict,
              ceilingKgM2: pv.ceilingKgM2,
              cautions: pv.cautions,
              proposalId: null,
              publishedAt: DEMO_PUBLISHED_AT,
            },
            { transaction },
          );
          await VerdictHistory.create(
            {
              feedstockId: row.id,
              setting: pv.setting,
              previousVerdict: null,
              verdict: pv.verdict,
              ceilingKgM2: pv.ceilingKgM2,
              cautions: pv.cautions,
              proposalId: null,
              decidedBy: moderator?.id ?? null,
              note: 'Starting verdict carried over from the network’s paper feeding notes.',
              decidedAt: DEMO_PUBLISHED_AT,
            },
            { transaction },
          );
        }
      }

      const sites = new Map(DEMO_SITES.map((s) => [s.key, s]));
      const trials = new Map<string, Trial>();
      let checkInCount = 0;
      for (const t of DEMO_TRIALS) {
        const feedstock = feedstocks.get(t.feedstockSlug);
        const owner = people.get(t.ownerKey);
        if (!feedstock || !owner) throw new Error(`demo trial ${t.key}: unknown feedstock or owner`);
        const loads = normaliseDose({
          dose: t.dose as DoseQuantity,
          area: { amount: t.surfaceAreaM2, unit: 'm2' },
          bulkDensityKgM3: feedstock.bulkDensityKgM3,
          layerDepth: t.layerDepthCm === null ? null : { amount: t.layerDepthCm, unit: 'cm' },
          wormMass: t.wormMassKg === null ? null : { amount: t.wormMassKg, unit: 'kg' },
        });
        const lastCheckIn = t.checkIns.at(-1);
        const row = await Trial.create(
          {
            feedstockId: feedstock.id,
            ownerId: owner.id,
            setting: t.setting,
            preparation: t.preparation,
            provenance: t.provenance,
            surfaceAreaM2: t.surfaceAreaM2,
            bedDepthCm: t.bedDepthCm,
            species: t.species,
            wormMassKg: t.wormMassKg,
            doseAmount: t.dose.amount,
            doseUnit: t.dose.unit,
            doseKg: loads.massKg,
            surfaceLoadKgM2: loads.surfaceLoadKgM2,
            layerDepthCm: loads.layerDepthCm,
            feedRatio: loads.feedRatio,
            isControl: t.isControl,
            region: sites.get(t.siteKey)?.region ?? owner.region ?? 'Unspecified region',
            startDate: t.startDate,
            checkInEveryDays: t.checkInEveryDays,
            status: t.status,
            confirmedOutcome: t.status === 'closed' ? t.confirmedOutcome : null,
            closeReason: t.closeReason,
            closedAt: t.status === 'running' || !lastCheckIn ? null : new Date(`${lastCheckIn.date}T18:00:00Z`),
            notes: t.notes,
            isDemo: true,
            createdAt: new Date(`${t.startDate}T08:00:00Z`),
          },
          { transaction },
        );
        trials.set(t.key, row);
        if (t.checkIns.length) {
          await CheckIn.bulkCreate(
            t.checkIns.map((c) => ({
              trialId: row.id,
              authorId: owner.id,
              observedOn: c.date,
              utcOffsetMinutes: 0,
              wormActivity: c.wormActivity,
              shareRemainingPct: c.shareRemainingPct,
              bedTempC: c.bedTempC,
              mould: c.mould,
              smell: c.smell,
              moisture: c.moisture,
              ph: c.pH,
              pests: c.pests,
              wormDeaths: c.wormDeaths,
              exodus: c.exodus,
              notes: c.notes,
              createdAt: new Date(`${c.date}T18:00:00Z`),
            })),
            { transaction },
          );
          checkInCount += t.checkIns.length;
        }
      }
      for (const t of DEMO_TRIALS) {
        if (!t.pairedTrialKey) continue;
        const paired = trials.get(t.pairedTrialKey);
        if (!paired) throw new Error(`demo trial ${t.key}: unknown paired trial ${t.pairedTrialKey}`);
        await trials.get(t.key)!.update({ pairedTrialId: paired.id }, { transaction });
      }

      const photoCount = await addDemoPhotos(
        DEMO_TRIALS.map((t) => ({ spec: t, row: trials.get(t.key)!, feedstockName: feedstocks.get(t.feedstockSlug)!.name })),
        opts.storage ?? getStorage(),
        transaction,
      );

      let voteCount = 0;
      for (const p of DEMO_PROPOSALS) {
        const feedstock = feedstocks.get(p.feedstockSlug)!;
        const proposal = await Proposal.create(
          {
            feedstockId: feedstock.id,
            authorId: people.get(p.authorKey)!.id,
            baseVerdictVersion: feedstock.verdictVersion,
            settings: p.settings,
            rationale: p.rationale,
            isDemo: true,
            createdAt: new Date(p.createdAt),
          },
          { transaction },
        );
        await ProposalTrial.bulkCreate(
          p.trialKeys.map((k) => ({ proposalId: proposal.id, trialId: trials.get(k)!.id })),
          { transaction },
        );
        for (const v of p.votes) {
          await Vote.create(
            { proposalId: proposal.id, voterId: people.get(v.voterKey)!.id, agree: v.agree, reason: v.reason },
            { transaction },
          );
          voteCount += 1;
        }
      }

      for (const r of DEMO_REQUESTS) {
        await FeedstockRequest.create(
          {
            name: r.name,
            note: r.note,
            requesterId: r.requesterKey ? people.get(r.requesterKey)!.id : null,
            isDemo: true,
            createdAt: new Date(r.createdAt),
          },
          { transaction },
        );
      }

      for (const sub of DEMO_SUBSCRIPTIONS) {
        const person = sub.personKey ? people.get(sub.personKey)! : null;
        await Subscription.create(
          {
            feedstockId: feedstocks.get(sub.feedstockSlug)!.id,
            userId: person?.id ?? null,
            email: person?.email ?? sub.email!,
            mode: sub.mode,
            confirmedAt: new Date(sub.confirmedAt),
            createdAt: new Date(sub.confirmedAt),
          },
          { transaction },
        );
      }

      for (const f of feedstocks.values()) await recomputeFeedstock(f.id, transaction);

      return {
        loaded: true,
        counts: {
          people: people.size,
          feedstocks: feedstocks.size,
          trials: trials.size,
          checkIns: checkInCount,
          photos: photoCount,
          proposals: DEMO_PROPOSALS.length,
          votes: voteCount,
          requests: DEMO_REQUESTS.length,
          subscriptions: DEMO_SUBSCRIPTIONS.length,
        },
      };
    });
  } catch (err) {
    // Another loader committed the marker first: the demo is there, nothing to add.
    if (err instanceof UniqueConstraintError) return { loaded: false, counts: {} };
    throw err;
  }
}

/** Placeholder photos rendered at once (sharp works on a thread pool). */
const PHOTO_CONCURRENCY = 4;

/**
 * Gives every demo trial its `photoCount` placeholder photos (demo-photos.ts),
 * stored through the storage interface under fixed keys (`demo/trial-<id>-<n>`,
 * so a repeated load overwrites rather than piles up) and recorded as Photo
 * rows: the first on the trial itself, the rest spread over its check-ins.
 * Returns how many were made.
 */
async function addDemoPhotos(
  trials: { spec: DemoTrial; row: Trial; feedstockName: string }[],
  storage: Storage,
  transaction: Transaction,
): Promise<number> {
  const withPhotos = trials.filter((t) => t.spec.photoCount > 0);
  if (!withPhotos.length) return 0;
  const checkIns = await CheckIn.findAll({
    where: { trialId: { [Op.in]: withPhotos.map((t) => t.row.id) } },
    attributes: ['id', 'trialId', 'observedOn'],
    order: [['observedOn', 'ASC'], ['id', 'ASC']],
    transaction,
  });
  const byTrial = new Map<number, CheckIn[]>();
  for (const c of checkIns) byTrial.set(c.trialId, [...(byTrial.get(c.trialId) ?? []), c]);

  const jobs = withPhotos.flatMap(({ spec, row, feedstockName }) => {
    const list = byTrial.get(row.id) ?? [];
    return Array.from({ length: spec.photoCount }, (_, k) => {
      // Photo 0 shows the set-up; the others go with check-ins, spread from first to last.
      const checkIn = k === 0 || !list.length ? null : list[Math.round(((k - 1) * (list.length - 1)) / Math.max(1, spec.photoCount - 2))] ?? list.at(-1)!;
      const day = checkIn ? Math.round((Date.parse(checkIn.observedOn) - Date.parse(row.startDate)) / 86_400_000) : 0;
      return { row, checkIn, k, day, feedstockName };
    });
  });
  const rows: Omit<InferCreationAttributes<Photo>, 'id' | 'updatedAt'>[] = [];
  // One picture per trial, shared by its photos (rendering is the slow part of loading the demo).
  const pictures = new Map<number, ReturnType<typeof renderPlaceholderPhoto>>();
  const pictureOf = (row: Trial, feedstockName: string) => {
    if (!pictures.has(row.id)) {
      pictures.set(row.id, renderPlaceholderPhoto({ title: `${feedstockName}, ${row.preparation}`, subtitle: `Trial ${row.id} · started ${row.startDate}`, pattern: row.id }));
    }
    return pictures.get(row.id)!;
  };
  let next = 0;
  const worker = async () => {
    for (let i = next++; i < jobs.length; i = next++) {
      const j = jobs[i];
      const photo = await pictureOf(j.row, j.feedstockName);
      const key = `demo/trial-${j.row.id}-${j.k + 1}.jpg`;
      const thumbKey = `demo/trial-${j.row.id}-${j.k + 1}-thumb.webp`;
      await storage.put(key, photo.full, 'image/jpeg');
      await storage.put(thumbKey, photo.thumb, 'image/webp');
      rows[i] = {
        trialId: j.row.id,
        checkInId: j.checkIn?.id ?? null,
        uploaderId: j.row.ownerId,
        storageKey: key,
        thumbKey,
        contentType: 'image/jpeg',
        width: photo.width,
        height: photo.height,
        bytes: photo.full.length,
        caption: `Demo placeholder for a photo of ${j.feedstockName.toLowerCase()} on day ${j.day}`,
        createdAt: new Date(`${j.checkIn?.observedOn ?? j.row.startDate}T18:00:00Z`),
      };
    }
  };
  await Promise.all(Array.from({ length: PHOTO_CONCURRENCY }, worker));
  await Photo.bulkCreate(rows, { transaction });
  return rows.length;
}
