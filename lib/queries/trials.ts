import 'server-only';
import { Op, QueryTypes, type WhereOptions } from 'sequelize';
import { sequelize } from '@/db';
import { CheckIn, Feedstock, Photo, Trial } from '@/db/models';
import type { Moisture, Pest, Smell, WormActivity } from '@/db/models/CheckIn';
import type { Outcome, Preparation, Provenance, Setting, Species, TrialStatus } from '@/db/models/Trial';
import type { TrialNeedingCheckIn } from '@/components/layout/home-sections';
import { ADVERSE_EVENT_WORDS, classifyTrial, dayNumber } from '@/lib/evidence';
import { can, type Actor } from '@/lib/policies';
import { toTrialInput } from '@/lib/services/evidence';
import { toPhotoDto, type PhotoDto } from '@/lib/photos/dto';
import { contributorLabel } from '@/lib/trials/contributor';
import { isCheckInDue, nextCheckInDue, utcDate } from '@/lib/trials/schedule';
import type { TrialListQuery } from '@/lib/validation/trials';

export type { PhotoDto } from '@/lib/photos/dto';

/** Trials per page of the trial list. */
export const TRIALS_PER_PAGE = 20;

const SETTING_NAMES: Record<Setting, string> = { bin: 'enclosed bin', 'flow-through': 'flow-through system', bed: 'open bed' };

/** One row of the trial list. */
export interface TrialListRow {
  id: number;
  feedstock: { slug: string; name: string };
  contributor: string;
  setting: Setting;
  preparation: Preparation;
  status: TrialStatus;
  startDate: string;
  region: string;
  dose: { amount: number; unit: string };
  surfaceAreaM2: number;
  surfaceLoadKgM2: number;
  checkInCount: number;
  lastCheckIn: string | null;
  photoCount: number;
  /** The owner's confirmed outcome once closed, else what the check-ins give so far (null: undecided). */
  outcome: Outcome | null;
  outcomeSource: 'owner' | 'check-ins' | null;
  isDemo: boolean;
}

/** A page of the trial list. */
export interface TrialListPage {
  rows: TrialListRow[];
  total: number;
  page: number;
  pageCount: number;
  perPage: number;
}

/** Account id of every contributor label that owns a trial (labels are one-way, so look them up). */
async function ownerIdForLabel(label: string): Promise<string | null> {
  const owners = await sequelize.query<{ owner_id: string }>('SELECT DISTINCT owner_id FROM trials', { type: QueryTypes.SELECT });
  return owners.find((o) => contributorLabel(o.owner_id) === label)?.owner_id ?? null;
}

/** Check-ins and photo counts of some trials, grouped by trial (two queries). */
async function loadCheckInsAndPhotos(trialIds: number[]) {
  if (!trialIds.length) return { checkIns: new Map<number, CheckIn[]>(), photos: new Map<number, number>() };
  const [rows, counts] = await Promise.all([
    CheckIn.findAll({ where: { trialId: { [Op.in]: trialIds } }, order: [['observedOn', 'ASC'], ['id', 'ASC']] }),
    Photo.count({ where: { trialId: { [Op.in]: trialIds } }, group: ['trialId'] }) as unknown as Promise<{ trialId: number; count: number }[]>,
  ]);
  const checkIns = new Map<number, CheckIn[]>();
  for (const c of rows) {
    const list = checkIns.get(c.trialId) ?? [];
    list.push(c);
    checkIns.set(c.trialId, list);
  }
  return { checkIns, photos: new Map(counts.map((c) => [Number(c.trialId), Number(c.count)])) };
}

/**
 * The trial list, newest start first, filtered by feedstock slug, setting,
 * status and contributor label, one page at a time. Four queries per page.
 */
export async function listTrials(filters: Partial<TrialListQuery> = {}, perPage = TRIALS_PER_PAGE): Promise<TrialListPage> {
  const page = Math.max(1, filters.page ?? 1);
  const empty: TrialListPage = { rows: [], total: 0, page, pageCount: 0, perPage };
  const where: WhereOptions<Trial> & Record<string, unknown> = {};
  if (filters.feedstock) {
    const f = await Feedstock.findOne({ where: { slug: filters.feedstock }, attributes: ['id'] });
    if (!f) return empty;
    where.feedstockId = f.id;
  }
  if (filters.setting) where.setting = filters.setting;
  if (filters.status) where.status = filters.status;
  if (filters.contributor) {
    const ownerId = await ownerIdForLabel(filters.contributor);
    if (!ownerId) return empty;
    where.ownerId = ownerId;
  }
  const { rows, count } = await Trial.findAndCountAll({
    where,
    include: [{ model: Feedstock, as: 'feedstock', attributes: ['id', 'slug', 'name'] }],
    order: [['startDate', 'DESC'], ['id', 'DESC']],
    limit: perPage,
    offset: (page - 1) * perPage,
  });
  const { checkIns, photos } = await loadCheckInsAndPhotos(rows.map((t) => t.id));
  return {
    rows: rows.map((t) => {
      const list = checkIns.get(t.id) ?? [];
      const c = classifyTrial(toTrialInput(t, list, 0));
      const feedstock = (t as Trial & { feedstock: Feedstock }).feedstock;
      return {
        id: t.id,
        feedstock: { slug: feedstock.slug, name: feedstock.name },
        contributor: contributorLabel(t.ownerId),
        setting: t.setting,
        preparation: t.preparation,
        status: t.status,
        startDate: t.startDate,
        region: t.region,
        dose: { amount: t.doseAmount, unit: t.doseUnit },
        surfaceAreaM2: t.surfaceAreaM2,
        surfaceLoadKgM2: t.surfaceLoadKgM2,
        checkInCount: list.length,
        lastCheckIn: list.at(-1)?.observedOn ?? null,
        photoCount: photos.get(t.id) ?? 0,
        outcome: c.outcome,
        outcomeSource: c.outcomeSource,
        isDemo: t.isDemo,
      };
    }),
    total: count,
    page,
    pageCount: Math.ceil(count / perPage),
    perPage,
  };
}

/** Choices for the trial list's filters: feedstocks with trials, and contributors with trials. */
export async function listTrialFilterOptions(): Promise<{ feedstocks: { slug: string; name: string }[]; contributors: string[] }> {
  const [feedstocks, owners] = await Promise.all([
    sequelize.query<{ slug: string; name: string }>(
      'SELECT DISTINCT f.slug, f.name FROM feedstocks f JOIN trials t ON t.feedstock_id = f.id ORDER BY f.name',
      { type: QueryTypes.SELECT },
    ),
    sequelize.query<{ owner_id: string }>('SELECT DISTINCT owner_id FROM trials', { type: QueryTypes.SELECT }),
  ]);
  return { feedstocks, contributors: owners.map((o) => contributorLabel(o.owner_id)).sort() };
}

/** One check-in on a trial page. */
export interface CheckInDto {
  id: number;
  observedOn: string;
  /** Days since the trial started. */
  day: number;
  wormActivity: WormActivity;
  shareRemainingPct: number;
  bedTempC: number | null;
  mould: boolean;
  smell: Smell;
  moisture: Moisture;
  ph: number | null;
  pests: Pest[];
  wormDeaths: boolean;
  exodus: boolean;
  notes: string;
  photos: PhotoDto[];
}

/** One point of a trial's timeline chart. */
export interface TimelinePoint {
  day: number;
  date: string;
  shareRemainingPct: number;
  wormActivity: WormActivity;
}

/** The short form of a trial, as shown beside its paired trial. */
export interface TrialSummaryDto {
  id: number;
  contributor: string;
  setting: Setting;
  preparation: Preparation;
  provenance: Provenance;
  isControl: boolean;
  status: TrialStatus;
  startDate: string;
  dose: { amount: number; unit: string };
  surfaceLoadKgM2: number;
  layerDepthCm: number | null;
  outcome: Outcome | null;
  outcomeSource: 'owner' | 'check-ins' | null;
  checkInCount: number;
  photoCount: number;
  timeline: TimelinePoint[];
}

/** Everything the trial page shows. */
export interface TrialDetail extends TrialSummaryDto {
  isDemo: boolean;
  feedstock: { id: number; slug: string; name: string; acceptsVolume: boolean };
  species: Species;
  region: string;
  surfaceAreaM2: number;
  bedDepthCm: number | null;
  wormMassKg: number | null;
  doseKg: number;
  feedRatio: number | null;
  checkInEveryDays: number;
  notes: string;
  version: number;
  proposedOutcome: Outcome | null;
  confirmedOutcome: Outcome | null;
  closeReason: string | null;
  closedAt: string | null;
  /** What the engine reads off the check-ins alone (classifyTrial without the keeper's confirmation). */
  derived: {
    outcome: Outcome | null;
    reasons: string[];
    adverseEvents: { event: string; words: string; firstDay: number }[];
    daysToConsumption: number | null;
    harmless: string[];
  };
  /** The outcome the engine would propose if the trial were closed now. */
  proposedIfClosed: Outcome | null;
  /** Next check-in date while running. */
  nextCheckInDue: string | null;
  checkIns: CheckInDto[];
  /** Photos of the trial that belong to no check-in. */
  photos: PhotoDto[];
  paired: TrialSummaryDto | null;
  /** What the viewer may do (lib/policies). */
  abilities: { canCheckIn: boolean; canUpload: boolean; canClose: boolean; canEdit: boolean };
}

function timelineOf(trial: Trial, checkIns: CheckIn[]): TimelinePoint[] {
  const start = dayNumber(trial.startDate);
  return checkIns.map((c) => ({ day: dayNumber(c.observedOn) - start, date: c.observedOn, shareRemainingPct: c.shareRemainingPct, wormActivity: c.wormActivity }));
}

function summaryOf(trial: Trial, checkIns: CheckIn[], photoCount: number): TrialSummaryDto {
  const c = classifyTrial(toTrialInput(trial, checkIns, photoCount));
  return {
    id: trial.id,
    contributor: contributorLabel(trial.ownerId),
    setting: trial.setting,
    preparation: trial.preparation,
    provenance: trial.provenance,
    isControl: trial.isControl,
    status: trial.status,
    startDate: trial.startDate,
    dose: { amount: trial.doseAmount, unit: trial.doseUnit },
    surfaceLoadKgM2: trial.surfaceLoadKgM2,
    layerDepthCm: trial.layerDepthCm,
    outcome: c.outcome,
    outcomeSource: c.outcomeSource,
    checkInCount: checkIns.length,
    photoCount,
    timeline: timelineOf(trial, checkIns),
  };
}

/**
 * A trial with its check-ins, photos, the engine's reading of it, its paired
 * trial and what `actor` may do with it; null when there is no such trial.
 * Five queries.
 */
export async function getTrialDetail(id: number, actor: Actor = null): Promise<TrialDetail | null> {
  const trial = await Trial.findByPk(id, { include: [{ model: Feedstock, as: 'feedstock', attributes: ['id', 'slug', 'name', 'bulkDensityKgM3'] }] });
  if (!trial) return null;
  const feedstock = (trial as Trial & { feedstock: Feedstock }).feedstock;
  const paired = trial.pairedTrialId ? await Trial.findByPk(trial.pairedTrialId) : null;
  const ids = paired ? [trial.id, paired.id] : [trial.id];
  const [{ checkIns }, photos] = await Promise.all([
    loadCheckInsAndPhotos(ids),
    Photo.findAll({ where: { trialId: { [Op.in]: ids } }, order: [['createdAt', 'ASC'], ['id', 'ASC']] }),
  ]);
  const mine = checkIns.get(trial.id) ?? [];
  const myPhotos = photos.filter((p) => p.trialId === trial.id).map(toPhotoDto);
  const input = toTrialInput(trial, mine, myPhotos.length);
  // What the check-ins alone say (the keeper's confirmation is shown beside it, not mixed in).
  const derived = classifyTrial({ ...input, outcomeOverride: null });
  const ifClosed = trial.status === 'running' ? classifyTrial({ ...input, status: 'closed', outcomeOverride: null }).outcome : (trial.proposedOutcome ?? derived.outcome);
  const start = dayNumber(trial.startDate);
  const resource = { ownerId: trial.ownerId };
  const running = trial.status === 'running';
  return {
    ...summaryOf(trial, mine, myPhotos.length),
    isDemo: trial.isDemo,
    feedstock: { id: feedstock.id, slug: feedstock.slug, name: feedstock.name, acceptsVolume: !!feedstock.bulkDensityKgM3 },
    species: trial.species,
    region: trial.region,
    surfaceAreaM2: trial.surfaceAreaM2,
    bedDepthCm: trial.bedDepthCm,
    wormMassKg: trial.wormMassKg,
    doseKg: trial.doseKg,
    feedRatio: trial.feedRatio,
    checkInEveryDays: trial.checkInEveryDays,
    notes: trial.notes,
    version: trial.version,
    proposedOutcome: trial.proposedOutcome ?? null,
    confirmedOutcome: trial.confirmedOutcome ?? null,
    closeReason: trial.closeReason ?? null,
    closedAt: trial.closedAt ? trial.closedAt.toISOString() : null,
    derived: {
      outcome: derived.outcome,
      reasons: derived.reasons,
      adverseEvents: derived.adverseEvents.map((e) => ({ event: e.event, words: ADVERSE_EVENT_WORDS[e.event], firstDay: e.firstDay })),
      daysToConsumption: derived.daysToConsumption,
      harmless: derived.harmless,
    },
    proposedIfClosed: ifClosed,
    nextCheckInDue: running ? nextCheckInDue(trial.startDate, trial.checkInEveryDays, mine.at(-1)?.observedOn ?? null) : null,
    checkIns: mine.map((c) => ({
      id: c.id,
      observedOn: c.observedOn,
      day: dayNumber(c.observedOn) - start,
      wormActivity: c.wormActivity,
      shareRemainingPct: c.shareRemainingPct,
      bedTempC: c.bedTempC,
      mould: c.mould,
      smell: c.smell,
      moisture: c.moisture,
      ph: c.ph,
      pests: c.pests ?? [],
      wormDeaths: c.wormDeaths,
      exodus: c.exodus,
      notes: c.notes,
      photos: myPhotos.filter((p) => p.checkInId === c.id),
    })),
    photos: myPhotos.filter((p) => p.checkInId === null),
    paired: paired ? summaryOf(paired, checkIns.get(paired.id) ?? [], photos.filter((p) => p.trialId === paired.id).length) : null,
    abilities: {
      canCheckIn: running && can(actor, 'check-in.create', resource),
      canUpload: can(actor, 'photo.upload', resource),
      canClose: running && can(actor, 'trial.close', resource),
      canEdit: can(actor, 'trial.update', resource),
    },
  };
}

/** A feedstock as offered by the new-trial form. */
export interface FeedstockChoice {
  id: number;
  slug: string;
  name: string;
  /** A volume dose needs the feedstock's bulk density. */
  acceptsVolume: boolean;
}

/** Every feedstock a trial can be logged for (merged ones left out), by name. */
export async function listFeedstockChoices(): Promise<FeedstockChoice[]> {
  const rows = await Feedstock.findAll({ where: { mergedIntoId: null }, attributes: ['id', 'slug', 'name', 'bulkDensityKgM3'], order: [['name', 'ASC']] });
  return rows.map((f) => ({ id: f.id, slug: f.slug, name: f.name, acceptsVolume: !!f.bulkDensityKgM3 }));
}

/** One of the actor's own trials, offered as the paired (comparison or control) trial. */
export interface PairableTrial {
  id: number;
  feedstockId: number;
  label: string;
}

/** The owner's trials, newest first, as choices for pairing. */
export async function listPairableTrials(ownerId: string, exceptTrialId: number | null = null): Promise<PairableTrial[]> {
  const rows = await Trial.findAll({
    where: { ownerId, ...(exceptTrialId ? { id: { [Op.ne]: exceptTrialId } } : {}) },
    attributes: ['id', 'feedstockId', 'setting', 'preparation', 'startDate'],
    order: [['startDate', 'DESC'], ['id', 'DESC']],
    limit: 200,
  });
  return rows.map((t) => ({ id: t.id, feedstockId: t.feedstockId, label: `Trial ${t.id}: ${t.preparation}, ${SETTING_NAMES[t.setting]}, started ${t.startDate}` }));
}

/** The trial form's values for editing a trial, or null when `actor` may not edit it. */
export async function getTrialForEdit(
  id: number,
  actor: Actor,
): Promise<{ id: number; feedstock: FeedstockChoice; version: number; values: Record<string, string>; pairable: PairableTrial[] } | null> {
  const trial = await Trial.findByPk(id, { include: [{ model: Feedstock, as: 'feedstock', attributes: ['id', 'slug', 'name', 'bulkDensityKgM3'] }] });
  if (!trial || !can(actor, 'trial.update', { ownerId: trial.ownerId })) return null;
  const f = (trial as Trial & { feedstock: Feedstock }).feedstock;
  const n = (x: number | null) => (x === null ? '' : String(x));
  return {
    id: trial.id,
    feedstock: { id: f.id, slug: f.slug, name: f.name, acceptsVolume: !!f.bulkDensityKgM3 },
    version: trial.version,
    // The owner's trials (not the editor's: a moderator may edit someone else's trial).
    pairable: (await listPairableTrials(trial.ownerId, trial.id)).filter((p) => p.feedstockId === f.id),
    values: {
      setting: trial.setting,
      preparation: trial.preparation,
      provenance: trial.provenance,
      'surfaceArea.amount': n(trial.surfaceAreaM2),
      'surfaceArea.unit': 'm2',
      'bedDepth.amount': n(trial.bedDepthCm),
      'bedDepth.unit': 'cm',
      species: trial.species,
      'wormMass.amount': n(trial.wormMassKg),
      'wormMass.unit': 'kg',
      'dose.amount': n(trial.doseAmount),
      'dose.unit': trial.doseUnit,
      'layerDepth.amount': n(trial.layerDepthCm),
      'layerDepth.unit': 'cm',
      pairedTrialId: trial.pairedTrialId ? String(trial.pairedTrialId) : '',
      isControl: trial.isControl ? 'on' : '',
      region: trial.region,
      startDate: trial.startDate,
      checkInEveryDays: String(trial.checkInEveryDays),
      notes: trial.notes,
    },
  };
}

/** A running trial whose next check-in is due. */
export interface DueCheckIn {
  trialId: number;
  /** Account id of the owner (server-side use: whom to remind); never shown. */
  ownerId: string;
  feedstockId: number;
  feedstockName: string;
  feedstockSlug: string;
  setting: Setting;
  preparation: Preparation;
  checkInEveryDays: number;
  startDate: string;
  lastCheckIn: string | null;
  /** The due date, `YYYY-MM-DD`. */
  due: string;
}

/**
 * Running trials (of one owner, or all) whose next check-in — start + k ×
 * schedule, the first after the last check-in — is due by `now` (its UTC
 * date), oldest due first. Two queries.
 */
export async function listDueCheckIns(now = new Date(), ownerId?: string): Promise<DueCheckIn[]> {
  const today = utcDate(now);
  const trials = await Trial.findAll({
    where: { status: 'running', ...(ownerId ? { ownerId } : {}) },
    include: [{ model: Feedstock, as: 'feedstock', attributes: ['id', 'slug', 'name'] }],
    order: [['id', 'ASC']],
  });
  if (!trials.length) return [];
  const last = await sequelize.query<{ trial_id: number; last: string | Date }>(
    'SELECT trial_id, MAX(observed_on) AS last FROM check_ins WHERE trial_id IN (:ids) GROUP BY trial_id',
    { replacements: { ids: trials.map((t) => t.id) }, type: QueryTypes.SELECT },
  );
  const byTrial = new Map(last.map((r) => [Number(r.trial_id), typeof r.last === 'string' ? r.last.slice(0, 10) : utcDate(new Date(r.last))]));
  return trials
    .map((t) => {
      const feedstock = (t as Trial & { feedstock: Feedstock }).feedstock;
      const lastCheckIn = byTrial.get(t.id) ?? null;
      return {
        trialId: t.id,
        ownerId: t.ownerId,
        feedstockId: feedstock.id,
        feedstockName: feedstock.name,
        feedstockSlug: feedstock.slug,
        setting: t.setting,
        preparation: t.preparation,
        checkInEveryDays: t.checkInEveryDays,
        startDate: t.startDate,
        lastCheckIn,
        due: nextCheckInDue(t.startDate, t.checkInEveryDays, lastCheckIn),
      };
    })
    .filter((d) => isCheckInDue(d.due, today))
    .sort((a, b) => a.due.localeCompare(b.due) || a.trialId - b.trialId);
}

/**
 * The owner's running trials whose next check-in (start + k × schedule, after
 * the last check-in) is due by today, for the home page.
 */
export async function listTrialsNeedingCheckIns(ownerId: string, now = new Date()): Promise<TrialNeedingCheckIn[]> {
  const rows = await listDueCheckIns(now, ownerId);
  return rows.map((d) => ({
    trialId: d.trialId,
    title: `Trial ${d.trialId}: ${d.feedstockName}, ${d.preparation}`,
    feedstockName: d.feedstockName,
    setting: d.setting,
    dueAt: `${d.due}T00:00:00Z`,
  }));
}

/** Trials of one feedstock, newest first (for the feedstock page). */
export async function listTrialsForFeedstock(slug: string, limit = 50): Promise<TrialListRow[]> {
  return (await listTrials({ feedstock: slug, page: 1 }, limit)).rows;
}

// ---------------------------------------------------------------- export

/** Columns of the trials table in exports, in order. */
export const TRIAL_EXPORT_COLUMNS = [
  'trial_id', 'feedstock_slug', 'feedstock_name', 'contributor', 'setting', 'preparation', 'provenance', 'species',
  'surface_area_m2', 'bed_depth_cm', 'worm_mass_kg', 'dose_amount', 'dose_unit', 'dose_kg', 'surface_load_kg_m2',
  'layer_depth_cm', 'feed_ratio', 'paired_trial_id', 'is_control', 'region', 'start_date', 'check_in_every_days',
  'status', 'derived_outcome', 'confirmed_outcome', 'close_reason', 'closed_at', 'check_in_count', 'photo_count', 'is_demo', 'notes',
] as const;
export type TrialExportColumn = (typeof TRIAL_EXPORT_COLUMNS)[number];

/** Columns of the check-ins table in exports, in order. Pests are separated by semicolons in CSV. */
export const CHECK_IN_EXPORT_COLUMNS = [
  'check_in_id', 'trial_id', 'feedstock_slug', 'observed_on', 'day', 'utc_offset_minutes', 'worm_activity',
  'share_remaining_pct', 'bed_temp_c', 'mould', 'smell', 'moisture', 'ph', 'pests', 'worm_deaths', 'exodus', 'photo_count', 'notes',
] as const;
export type CheckInExportColumn = (typeof CHECK_IN_EXPORT_COLUMNS)[number];

type Cell = string | number | boolean | null;
/** One trial in an export, by column. */
export type TrialExportRow = Record<TrialExportColumn, Cell>;
/** One check-in in an export, by column (pests as a list; CSV joins them with ";"). */
export type CheckInExportRow = Record<Exclude<CheckInExportColumn, 'pests'>, Cell> & { pests: string[] };

/**
 * Every trial (of one feedstock, or all) and its check-ins as export rows:
 * region only, contributors by pseudonymous label, no e-mail or account id.
 * Null when the feedstock slug is unknown. Four queries.
 */
export async function listTrialsForExport(feedstockSlug?: string): Promise<{ trials: TrialExportRow[]; checkIns: CheckInExportRow[] } | null> {
  let where: WhereOptions<Trial> = {};
  if (feedstockSlug) {
    const f = await Feedstock.findOne({ where: { slug: feedstockSlug }, attributes: ['id'] });
    if (!f) return null;
    where = { feedstockId: f.id };
  }
  const trials = await Trial.findAll({
    where,
    include: [{ model: Feedstock, as: 'feedstock', attributes: ['id', 'slug', 'name'] }],
    order: [['id', 'ASC']],
  });
  const ids = trials.map((t) => t.id);
  const { checkIns } = await loadCheckInsAndPhotos(ids);
  const photoRows = ids.length ? await Photo.findAll({ where: { trialId: { [Op.in]: ids } }, attributes: ['trialId', 'checkInId'] }) : [];
  const photosByTrial = new Map<number, number>();
  const photosByCheckIn = new Map<number, number>();
  for (const p of photoRows) {
    photosByTrial.set(p.trialId, (photosByTrial.get(p.trialId) ?? 0) + 1);
    if (p.checkInId) photosByCheckIn.set(p.checkInId, (photosByCheckIn.get(p.checkInId) ?? 0) + 1);
  }
  const trialRows: TrialExportRow[] = [];
  const checkInRows: CheckInExportRow[] = [];
  for (const t of trials) {
    const f = (t as Trial & { feedstock: Feedstock }).feedstock;
    const list = checkIns.get(t.id) ?? [];
    const derived = classifyTrial({ ...toTrialInput(t, list, 0), outcomeOverride: null });
    trialRows.push({
      trial_id: t.id,
      feedstock_slug: f.slug,
      feedstock_name: f.name,
      contributor: contributorLabel(t.ownerId),
      setting: t.setting,
      preparation: t.preparation,
      provenance: t.provenance,
      species: t.species,
      surface_area_m2: t.surfaceAreaM2,
      bed_depth_cm: t.bedDepthCm,
      worm_mass_kg: t.wormMassKg,
      dose_amount: t.doseAmount,
      dose_unit: t.doseUnit,
      dose_kg: t.doseKg,
      surface_load_kg_m2: t.surfaceLoadKgM2,
      layer_depth_cm: t.layerDepthCm,
      feed_ratio: t.feedRatio,
      paired_trial_id: t.pairedTrialId ?? null,
      is_control: t.isControl,
      region: t.region,
      start_date: t.startDate,
      check_in_every_days: t.checkInEveryDays,
      status: t.status,
      derived_outcome: derived.outcome,
      confirmed_outcome: t.confirmedOutcome ?? null,
      close_reason: t.closeReason ?? null,
      closed_at: t.closedAt ? t.closedAt.toISOString() : null,
      check_in_count: list.length,
      photo_count: photosByTrial.get(t.id) ?? 0,
      is_demo: t.isDemo,
      notes: t.notes,
    });
    const start = dayNumber(t.startDate);
    for (const c of list) {
      checkInRows.push({
        check_in_id: c.id,
        trial_id: t.id,
        feedstock_slug: f.slug,
        observed_on: c.observedOn,
        day: dayNumber(c.observedOn) - start,
        utc_offset_minutes: c.utcOffsetMinutes,
        worm_activity: c.wormActivity,
        share_remaining_pct: c.shareRemainingPct,
        bed_temp_c: c.bedTempC,
        mould: c.mould,
        smell: c.smell,
        moisture: c.moisture,
        ph: c.ph,
        pests: c.pests ?? [],
        worm_deaths: c.wormDeaths,
        exodus: c.exodus,
        photo_count: photosByCheckIn.get(c.id) ?? 0,
        notes: c.notes,
      });
    }
  }
  return { trials: trialRows, checkIns: checkInRows };
}

/** The slug of a trial's feedstock (for revalidating its page); null when there is no such trial. */
export async function getTrialFeedstockSlug(trialId: number): Promise<string | null> {
  const t = await Trial.findByPk(trialId, { attributes: ['id', 'feedstockId'], include: [{ model: Feedstock, as: 'feedstock', attributes: ['slug'] }] });
  return t ? (t as Trial & { feedstock: Feedstock }).feedstock.slug : null;
}
