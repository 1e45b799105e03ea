import 'server-only';
import { Op, QueryTypes } from 'sequelize';
import { sequelize } from '@/db';
import {
  EvidenceAggregate,
  EvidenceVerdict,
  Feedstock,
  FeedstockAlias,
  FeedstockRedirect,
  FeedstockRequest,
  FeedstockRevision,
  PublishedVerdict,
  Trial,
  User,
} from '@/db/models';
import type { Category, HandlingCaution } from '@/db/models/Feedstock';
import type { Certainty, Verdict } from '@/db/models/EvidenceAggregate';
import type { Outcome, Preparation, Setting, TrialStatus } from '@/db/models/Trial';
import type { GroupAggregate, SettingVerdict, SurvivalRow } from '@/lib/evidence/types';
import { diffText, type DiffPart } from '@/lib/text-diff';
import { CATEGORY_LABELS } from '@/lib/vocabulary';

export type { DiffPart };

const SETTING_ORDER: readonly Setting[] = ['bin', 'flow-through', 'bed'];
const CERTAINTY_RANK: Record<Certainty, number> = { high: 4, moderate: 3, low: 2, 'very low': 1 };

// ---------------------------------------------------------------- index

/** One row of the feedstock index. */
export interface FeedstockIndexRow {
  slug: string;
  name: string;
  category: Category;
  family: string | null;
  published: Partial<Record<Setting, Verdict>>;
  evidence: Partial<Record<Setting, { verdict: Verdict; certainty: Certainty }>>;
  /** The strongest certainty among the feedstock's evidence verdicts; null without evidence. */
  certainty: Certainty | null;
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
      certainty: null,
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
  for (const e of evidence) {
    const row = rows.get(e.feedstockId)!;
    row.evidence[e.setting] = { verdict: e.verdict, certainty: e.certainty };
    if (!row.certainty || CERTAINTY_RANK[e.certainty] > CERTAINTY_RANK[row.certainty]) row.certainty = e.certainty;
  }
  for (const c of counts) {
    const row = rows.get(Number(c.feedstock_id))!;
    row.trialCount = Number(c.n);
    bump(row, c.last);
  }
  return [...rows.values()];
}

/** Sort keys of the index table. */
export const INDEX_SORTS = ['name', 'category', 'certainty', 'trials', 'changed'] as const;
export type IndexSort = (typeof INDEX_SORTS)[number];

/** What the index page asks for (already validated). */
export interface FeedstockIndexQuery {
  category?: Category;
  setting?: Setting;
  verdict?: Verdict;
  q?: string;
  sort: IndexSort;
  dir: 'asc' | 'desc';
  page: number;
  perPage: number;
}

/** One page of the index and how many there are. */
export interface FeedstockIndexPage {
  rows: FeedstockIndexRow[];
  total: number;
  page: number;
  pages: number;
}

/**
 * The index filtered (category; published verdict, in one setting or any),
 * sorted and paginated. A page number past the end gives the last page.
 */
export async function listFeedstockIndex(query: FeedstockIndexQuery): Promise<FeedstockIndexPage> {
  let rows = await listFeedstocks({ category: query.category ?? null });
  if (query.verdict) {
    const v = query.verdict;
    rows = rows.filter((r) => (query.setting ? r.published[query.setting] === v : SETTING_ORDER.some((s) => r.published[s] === v)));
  } else if (query.setting) {
    const s = query.setting;
    rows = rows.filter((r) => r.published[s] !== undefined);
  }
  const q = query.q?.trim().toLowerCase();
  if (q) rows = rows.filter((r) => r.name.toLowerCase().includes(q) || (r.family ?? '').toLowerCase().includes(q));
  const byName = (a: FeedstockIndexRow, b: FeedstockIndexRow) => a.name.localeCompare(b.name);
  const cmp: Record<IndexSort, (a: FeedstockIndexRow, b: FeedstockIndexRow) => number> = {
    name: byName,
    category: (a, b) => CATEGORY_LABELS[a.category].localeCompare(CATEGORY_LABELS[b.category]),
    certainty: (a, b) => (a.certainty ? CERTAINTY_RANK[a.certainty] : 0) - (b.certainty ? CERTAINTY_RANK[b.certainty] : 0),
    trials: (a, b) => a.trialCount - b.trialCount,
    changed: (a, b) => a.lastChange.localeCompare(b.lastChange),
  };
  const sign = query.dir === 'desc' ? -1 : 1;
  rows.sort((a, b) => sign * cmp[query.sort](a, b) || byName(a, b));
  const total = rows.length;
  const pages = Math.max(1, Math.ceil(total / query.perPage));
  const page = Math.min(Math.max(1, query.page), pages);
  return { rows: rows.slice((page - 1) * query.perPage, page * query.perPage), total, page, pages };
}

// ---------------------------------------------------------------- slug resolution

/** Where a slug leads: a feedstock, a permanent redirect, or nowhere. */
export type SlugResolution =
  | { kind: 'found'; id: number; slug: string; /** Changes when the feedstock row changes (part of cache keys). */ stamp: string }
  | { kind: 'redirect'; slug: string }
  | { kind: 'missing' };

function stampOf(f: Feedstock): string {
  return `${f.createdAt.getTime()}.${f.updatedAt.getTime()}.${f.version}.${f.verdictVersion}`;
}

/**
 * Resolves a page slug. A merged feedstock, or an old slug left by a rename
 * or merge, leads to the current feedstock (following merges, at most 10 hops).
 */
export async function resolveFeedstockSlug(slug: string): Promise<SlugResolution> {
  const row = await Feedstock.findOne({ where: { slug }, attributes: ['id', 'slug', 'mergedIntoId', 'version', 'verdictVersion', 'createdAt', 'updatedAt'] });
  let targetId: number | null = null;
  if (row && !row.mergedIntoId) return { kind: 'found', id: row.id, slug: row.slug, stamp: stampOf(row) };
  if (row) targetId = row.mergedIntoId;
  else {
    const redirect = await FeedstockRedirect.findOne({ where: { oldSlug: slug }, attributes: ['feedstockId'] });
    if (!redirect) return { kind: 'missing' };
    targetId = redirect.feedstockId;
  }
  for (let hops = 0; hops < 10 && targetId !== null; hops++) {
    const target: Feedstock | null = await Feedstock.findByPk(targetId, { attributes: ['id', 'slug', 'mergedIntoId', 'version', 'verdictVersion', 'createdAt', 'updatedAt'] });
    if (!target) return { kind: 'missing' };
    if (!target.mergedIntoId) return target.slug === slug ? { kind: 'found', id: target.id, slug, stamp: stampOf(target) } : { kind: 'redirect', slug: target.slug };
    targetId = target.mergedIntoId;
  }
  return { kind: 'missing' };
}

// ---------------------------------------------------------------- feedstock page

/** A published verdict for one setting. */
export interface PublishedSettingDTO {
  verdict: Verdict;
  ceilingKgM2: number | null;
  cautions: string[];
  publishedAt: string;
  proposalId: number | null;
}

/** The evidence verdict for one setting, with its plain-language working. */
export interface EvidenceSettingDTO {
  verdict: Verdict;
  label: string;
  certainty: Certainty;
  ceilingKgM2: number | null;
  ceilingPreparation: Preparation | null;
  trialCount: number;
  finishedCount: number;
  settled: boolean;
  provisionalVerdict: Verdict | null;
  sentences: string[];
  certaintyReasons: { domain: string; reasons: string[] }[];
  certaintyBase: string;
  computedAt: string;
}

/** The engine's caution sentences for one setting (from its preparation groups). */
export interface EvidenceCautionDTO {
  event: string;
  preparation: Preparation;
  text: string;
}

/** One preparation group's time-to-consumption curve. */
export interface SurvivalCurveDTO {
  preparation: Preparation;
  n: number;
  events: number;
  censored: number;
  median: number | null;
  medianLower: number | null;
  medianUpper: number | null;
  table: SurvivalRow[];
}

/** Everything shown about one setting. */
export interface SettingSectionDTO {
  setting: Setting;
  published: PublishedSettingDTO | null;
  evidence: EvidenceSettingDTO | null;
  /** True when both exist and the verdicts differ. */
  disagree: boolean;
  cautions: EvidenceCautionDTO[];
  survival: SurvivalCurveDTO[];
  /** How each preparation tried in this setting fared (from the evidence groups). */
  preparations: PreparationDTO[];
}

/** One preparation's evidence in one setting. */
export interface PreparationDTO {
  preparation: Preparation;
  verdict: Verdict;
  provisionalVerdict: Verdict | null;
  settled: boolean;
  trialCount: number;
  finishedCount: number;
  ceilingKgM2: number | null;
  successShare: number | null;
}

/** One linked trial, as the page lists it (region only, nothing that places a person). */
export interface TrialRowDTO extends TrialTableRow {
  startDate: string;
}

/** What a table of trials shows (feedstock pages, proposals): setting, preparation, load, status, outcome, region only. */
export interface TrialTableRow {
  id: number;
  setting: Setting;
  preparation: Preparation;
  surfaceLoadKgM2: number;
  status: TrialStatus;
  outcome: Outcome | null;
  region: string;
}

/** A feedstock of the same family. */
export interface RelatedFeedstockDTO {
  slug: string;
  name: string;
  published: Partial<Record<Setting, Verdict>>;
}

/** The feedstock page, as plain data. */
export interface FeedstockPageDTO {
  id: number;
  slug: string;
  name: string;
  category: Category;
  family: string | null;
  summary: string;
  pageText: string;
  version: number;
  aliases: string[];
  handlingCautions: HandlingCaution[];
  reference: { cnRatio: number | null; nitrogenPct: number | null; moisturePct: number | null; bulkDensityKgM3: number | null; source: string | null };
  settings: SettingSectionDTO[];
  trials: TrialRowDTO[];
  related: RelatedFeedstockDTO[];
  isDemo: boolean;
  updatedAt: string;
  lastChange: string;
}

/**
 * Loads the feedstock page by id (seven small queries, no N+1). Returns null
 * for an unknown or merged feedstock. Plain JSON: safe to cache.
 */
export async function loadFeedstockPage(id: number): Promise<FeedstockPageDTO | null> {
  const f = await Feedstock.findByPk(id);
  if (!f || f.mergedIntoId) return null;
  const [aliases, published, evidence, groups, trials, relatedRows] = await Promise.all([
    FeedstockAlias.findAll({ where: { feedstockId: id }, attributes: ['alias'], order: [['alias', 'ASC']] }),
    PublishedVerdict.findAll({ where: { feedstockId: id } }),
    EvidenceVerdict.findAll({ where: { feedstockId: id } }),
    EvidenceAggregate.findAll({ where: { feedstockId: id }, order: [['setting', 'ASC'], ['preparation', 'ASC']] }),
    Trial.findAll({
      where: { feedstockId: id },
      attributes: ['id', 'setting', 'preparation', 'surfaceLoadKgM2', 'status', 'confirmedOutcome', 'region', 'startDate', 'updatedAt'],
      order: [['startDate', 'DESC'], ['id', 'DESC']],
    }),
    f.family
      ? Feedstock.findAll({
          where: { family: f.family, id: { [Op.ne]: id }, mergedIntoId: null },
          attributes: ['id', 'slug', 'name'],
          order: [['name', 'ASC']],
          limit: 8,
        })
      : Promise.resolve([] as Feedstock[]),
  ]);
  const relatedVerdicts = relatedRows.length
    ? await PublishedVerdict.findAll({ where: { feedstockId: { [Op.in]: relatedRows.map((r) => r.id) } }, attributes: ['feedstockId', 'setting', 'verdict'] })
    : [];

  let lastChange = f.updatedAt.toISOString();
  const bump = (d: Date | string | null | undefined) => {
    if (!d) return;
    const iso = new Date(d).toISOString();
    if (iso > lastChange) lastChange = iso;
  };

  const settings: SettingSectionDTO[] = [];
  for (const setting of SETTING_ORDER) {
    const p = published.find((x) => x.setting === setting) ?? null;
    const e = evidence.find((x) => x.setting === setting) ?? null;
    const groupRows = groups.filter((g) => g.setting === setting);
    if (!p && !e && !groupRows.length) continue;
    if (p) bump(p.publishedAt);
    const sv = (e?.result ?? null) as SettingVerdict | null;
    const evidenceDto: EvidenceSettingDTO | null =
      e && sv
        ? {
            verdict: e.verdict,
            label: sv.label,
            certainty: e.certainty,
            ceilingKgM2: sv.ceiling.kgM2,
            ceilingPreparation: sv.ceiling.preparation,
            trialCount: sv.counts.trials,
            finishedCount: sv.counts.finished,
            settled: sv.settled,
            provisionalVerdict: sv.provisionalVerdict,
            sentences: sv.derivation.sentences,
            certaintyReasons: (sv.certainty?.downgrades ?? []).map((d) => ({ domain: d.domain, reasons: d.reasons })),
            certaintyBase: sv.certainty?.baseReason ?? '',
            computedAt: e.computedAt.toISOString(),
          }
        : null;
    const cautions: EvidenceCautionDTO[] = [];
    const survival: SurvivalCurveDTO[] = [];
    const preparations: PreparationDTO[] = [];
    for (const row of groupRows) {
      const g = row.result as GroupAggregate;
      preparations.push({
        preparation: g.preparation,
        verdict: g.verdict,
        provisionalVerdict: g.provisionalVerdict,
        settled: g.settled,
        trialCount: g.counts.trials,
        finishedCount: g.counts.finished,
        ceilingKgM2: g.ceiling.kgM2,
        successShare: g.success.proportion,
      });
      for (const c of g.cautions) cautions.push({ event: c.event, preparation: g.preparation, text: c.text });
      const km = g.timeToConsumption;
      if (km.n > 0) {
        survival.push({
          preparation: g.preparation,
          n: km.n,
          events: km.events,
          censored: km.censored,
          median: km.median,
          medianLower: km.medianLower,
          medianUpper: km.medianUpper,
          table: km.table,
        });
      }
    }
    settings.push({
      setting,
      published: p
        ? {
            verdict: p.verdict,
            ceilingKgM2: p.ceilingKgM2,
            cautions: p.cautions ?? [],
            publishedAt: p.publishedAt.toISOString(),
            proposalId: p.proposalId,
          }
        : null,
      evidence: evidenceDto,
      disagree: !!p && !!evidenceDto && p.verdict !== evidenceDto.verdict,
      cautions,
      survival,
      preparations,
    });
  }

  for (const t of trials) bump(t.updatedAt);
  return {
    id: f.id,
    slug: f.slug,
    name: f.name,
    category: f.category,
    family: f.family,
    summary: f.summary,
    pageText: f.pageText,
    version: f.version,
    aliases: aliases.map((a) => a.alias),
    handlingCautions: f.handlingCautions ?? [],
    reference: {
      cnRatio: f.cnRatio,
      nitrogenPct: f.nitrogenPct,
      moisturePct: f.moisturePct,
      bulkDensityKgM3: f.bulkDensityKgM3,
      source: f.referenceSource,
    },
    settings,
    trials: trials.map((t) => ({
      id: t.id,
      setting: t.setting,
      preparation: t.preparation,
      surfaceLoadKgM2: t.surfaceLoadKgM2,
      status: t.status,
      outcome: t.status === 'closed' ? t.confirmedOutcome : null,
      region: t.region,
      startDate: t.startDate,
    })),
    related: relatedRows.map((r) => {
      const pv: Partial<Record<Setting, Verdict>> = {};
      for (const v of relatedVerdicts) if (v.feedstockId === r.id) pv[v.setting] = v.verdict;
      return { slug: r.slug, name: r.name, published: pv };
    }),
    isDemo: f.isDemo,
    updatedAt: f.updatedAt.toISOString(),
    lastChange,
  };
}

// ---------------------------------------------------------------- text history

/** One published version of the page text, with what changed from the one before. */
export interface RevisionHistoryEntry {
  id: number;
  /** The text version this revision produced. */
  version: number;
  authorName: string | null;
  reviewerName: string | null;
  editSummary: string;
  createdAt: string;
  publishedAt: string | null;
  isCurrent: boolean;
  diff: DiffPart[];
  added: number;
  removed: number;
}

/** A feedstock's page-text history, newest first, with a diff for each published version. */
export async function listRevisionHistory(feedstockId: number): Promise<{ entries: RevisionHistoryEntry[]; pending: number; rejected: number }> {
  const revisions = await FeedstockRevision.findAll({
    where: { feedstockId },
    order: [['id', 'ASC']],
    include: [{ model: User, as: 'author', attributes: ['name'] }],
  });
  const feedstock = await Feedstock.findByPk(feedstockId, { attributes: ['version'] });
  const reviewerIds = [...new Set(revisions.map((r) => r.reviewerId).filter((x): x is string => !!x))];
  const reviewers = reviewerIds.length ? await User.findAll({ where: { id: reviewerIds }, attributes: ['id', 'name'] }) : [];
  const reviewerName = new Map(reviewers.map((u) => [u.id, u.name]));
  const entries: RevisionHistoryEntry[] = [];
  let previous = '';
  for (const r of revisions.filter((x) => x.status === 'published')) {
    const d = diffText(previous, r.body);
    const author = (r as unknown as { author?: User | null }).author;
    entries.push({
      id: r.id,
      version: r.baseVersion + 1,
      authorName: author?.name ?? null,
      reviewerName: r.reviewerId ? (reviewerName.get(r.reviewerId) ?? null) : null,
      editSummary: r.editSummary,
      createdAt: r.createdAt.toISOString(),
      publishedAt: r.reviewedAt ? r.reviewedAt.toISOString() : null,
      isCurrent: r.baseVersion + 1 === feedstock?.version,
      diff: d.parts,
      added: d.added,
      removed: d.removed,
    });
    previous = r.body;
  }
  return {
    entries: entries.reverse(),
    pending: revisions.filter((r) => r.status === 'pending').length,
    rejected: revisions.filter((r) => r.status === 'rejected').length,
  };
}

/** A suggested edit waiting for an editor. */
export interface PendingEditDTO {
  id: number;
  feedstockId: number;
  feedstockSlug: string;
  feedstockName: string;
  authorName: string | null;
  editSummary: string;
  createdAt: string;
  baseVersion: number;
  currentVersion: number;
  /** True when the page changed after the edit was suggested (approving it would conflict). */
  stale: boolean;
  diff: DiffPart[];
  added: number;
  removed: number;
  body: string;
}

/** Suggested edits waiting for review, oldest first, each diffed against the current text. */
export async function listPendingEdits(opts: { feedstockId?: number } = {}): Promise<PendingEditDTO[]> {
  const revisions = await FeedstockRevision.findAll({
    where: { status: 'pending', ...(opts.feedstockId ? { feedstockId: opts.feedstockId } : {}) },
    order: [['createdAt', 'ASC'], ['id', 'ASC']],
    include: [
      { model: User, as: 'author', attributes: ['name'] },
      { model: Feedstock, attributes: ['id', 'slug', 'name', 'version', 'pageText'] },
    ],
  });
  return revisions.map((r) => {
    const f = (r as unknown as { feedstock: Feedstock }).feedstock;
    const author = (r as unknown as { author?: User | null }).author;
    const d = diffText(f.pageText, r.body);
    return {
      id: r.id,
      feedstockId: f.id,
      feedstockSlug: f.slug,
      feedstockName: f.name,
      authorName: author?.name ?? null,
      editSummary: r.editSummary,
      createdAt: r.createdAt.toISOString(),
      baseVersion: r.baseVersion,
      currentVersion: f.version,
      stale: r.baseVersion !== f.version,
      diff: d.parts,
      added: d.added,
      removed: d.removed,
      body: r.body,
    };
  });
}

/** What became of a suggested edit an editor decided (for the queue's confirmation). Null if unknown or still pending. */
export async function getDecidedEdit(id: number): Promise<{ feedstockName: string; feedstockSlug: string; status: 'published' | 'rejected'; version: number } | null> {
  const r = await FeedstockRevision.findByPk(id, { include: [{ model: Feedstock, attributes: ['slug', 'name'] }] });
  if (!r || r.status === 'pending') return null;
  const f = (r as unknown as { feedstock: Feedstock }).feedstock;
  return { feedstockName: f.name, feedstockSlug: f.slug, status: r.status, version: r.baseVersion + 1 };
}

/** The page text and version an editor starts from. Null for an unknown or merged feedstock. */
export async function getEditableText(id: number): Promise<{ id: number; slug: string; name: string; pageText: string; version: number } | null> {
  const f = await Feedstock.findByPk(id, { attributes: ['id', 'slug', 'name', 'pageText', 'version', 'mergedIntoId'] });
  if (!f || f.mergedIntoId) return null;
  return { id: f.id, slug: f.slug, name: f.name, pageText: f.pageText, version: f.version };
}

// ---------------------------------------------------------------- requests, sitemap, choices

/** A reader's request for a feedstock, as editors see it. */
export interface FeedstockRequestDTO {
  id: number;
  name: string;
  note: string | null;
  status: 'open' | 'added' | 'declined';
  createdAt: string;
  feedstockSlug: string | null;
}

/** Requests for new feedstocks, open ones first, newest first within each status. */
export async function listFeedstockRequests(): Promise<FeedstockRequestDTO[]> {
  const rows = await FeedstockRequest.findAll({ order: [['createdAt', 'DESC'], ['id', 'DESC']], limit: 500 });
  const ids = [...new Set(rows.map((r) => r.feedstockId).filter((x): x is number => !!x))];
  const slugs = ids.length ? await Feedstock.findAll({ where: { id: ids }, attributes: ['id', 'slug'] }) : [];
  const slugOf = new Map(slugs.map((f) => [f.id, f.slug]));
  const order = { open: 0, added: 1, declined: 2 } as const;
  return rows
    .map((r) => ({
      id: r.id,
      name: r.name,
      note: r.note,
      status: r.status as FeedstockRequestDTO['status'],
      createdAt: r.createdAt.toISOString(),
      feedstockSlug: r.feedstockId ? (slugOf.get(r.feedstockId) ?? null) : null,
    }))
    .sort((a, b) => order[a.status] - order[b.status]);
}

/** Every current feedstock's slug and last change, for the sitemap. */
export async function listFeedstockSlugs(): Promise<{ slug: string; updatedAt: string }[]> {
  const rows = await Feedstock.findAll({ where: { mergedIntoId: null }, attributes: ['slug', 'updatedAt'], order: [['slug', 'ASC']] });
  return rows.map((r) => ({ slug: r.slug, updatedAt: r.updatedAt.toISOString() }));
}

/** A feedstock's reference values for the mix calculator. */
export interface MixMaterialDTO {
  id: string;
  name: string;
  nitrogenPct: number;
  cnRatio: number;
  moisturePct: number;
  source: string;
}

/** Feedstocks that have C:N, %N and moisture on record, for the mix calculator. */
export async function listMixFeedstocks(): Promise<MixMaterialDTO[]> {
  const rows = await Feedstock.findAll({
    where: { mergedIntoId: null, cnRatio: { [Op.ne]: null }, nitrogenPct: { [Op.ne]: null }, moisturePct: { [Op.ne]: null } },
    attributes: ['slug', 'name', 'cnRatio', 'nitrogenPct', 'moisturePct', 'referenceSource'],
    order: [['name', 'ASC']],
  });
  return rows.map((r) => ({
    id: `feedstock:${r.slug}`,
    name: r.name,
    nitrogenPct: r.nitrogenPct!,
    cnRatio: r.cnRatio!,
    moisturePct: r.moisturePct!,
    source: r.referenceSource ?? 'feedstock table',
  }));
}

/** Current feedstocks for a picker (merge target), by name. */
export async function listFeedstockChoices(): Promise<{ id: number; slug: string; name: string }[]> {
  const rows = await Feedstock.findAll({ where: { mergedIntoId: null }, attributes: ['id', 'slug', 'name'], order: [['name', 'ASC']] });
  return rows.map((r) => ({ id: r.id, slug: r.slug, name: r.name }));
}

// ---------------------------------------------------------------- feed

