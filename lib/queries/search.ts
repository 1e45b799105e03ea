import 'server-only';
import { QueryTypes } from 'sequelize';
import { sequelize } from '@/db';
import { Feedstock, FeedstockAlias, PublishedVerdict } from '@/db/models';
import { CATEGORY_LABELS } from '@/lib/vocabulary';
import { FeedstockSearchIndex, type SearchDocument, type SearchOutcome } from '@/lib/search/engine';

/**
 * The search index of this server process. Built from the database on first
 * use and rebuilt when feedstocks change: a cheap version query (row counts
 * and newest change times of feedstocks, aliases and published verdicts) runs
 * at most once per VERSION_CHECK_MS, and writes in this process drop the index
 * at once through `invalidateSearchIndex`. Other processes notice within
 * VERSION_CHECK_MS.
 */
const VERSION_CHECK_MS = 1_000;

interface Holder {
  index: FeedstockSearchIndex | null;
  version: string | null;
  checkedAt: number;
  building: Promise<FeedstockSearchIndex> | null;
}

const g = globalThis as unknown as { __trialbedSearch?: Holder };
const holder: Holder = (g.__trialbedSearch ??= { index: null, version: null, checkedAt: 0, building: null });

/** The data version the index is built from: counts and newest change times. */
async function readVersion(): Promise<string> {
  const [row] = await sequelize.query<{ f: string; a: string; p: string }>(
    `SELECT
       (SELECT CONCAT(COUNT(*), '/', IFNULL(MAX(updated_at), '')) FROM feedstocks) AS f,
       (SELECT CONCAT(COUNT(*), '/', IFNULL(MAX(updated_at), ''), '/', IFNULL(MAX(id), 0)) FROM feedstock_aliases) AS a,
       (SELECT CONCAT(COUNT(*), '/', IFNULL(MAX(published_at), '')) FROM published_verdicts) AS p`,
    { type: QueryTypes.SELECT },
  );
  return `${row.f}|${row.a}|${row.p}`;
}

/** Every current (not merged) feedstock as a search document. Three queries. */
export async function loadSearchDocuments(): Promise<SearchDocument[]> {
  const [feedstocks, aliases, published] = await Promise.all([
    Feedstock.findAll({
      where: { mergedIntoId: null },
      attributes: ['id', 'slug', 'name', 'family', 'category', 'summary'],
      order: [['id', 'ASC']],
    }),
    FeedstockAlias.findAll({ attributes: ['feedstockId', 'alias'], order: [['id', 'ASC']] }),
    PublishedVerdict.findAll({ attributes: ['feedstockId', 'setting', 'verdict'] }),
  ]);
  const docs = new Map<number, SearchDocument>();
  for (const f of feedstocks) {
    docs.set(f.id, {
      id: f.id,
      slug: f.slug,
      name: f.name,
      aliases: [],
      family: f.family,
      category: f.category,
      categoryLabel: CATEGORY_LABELS[f.category],
      summary: f.summary,
      published: {},
    });
  }
  for (const a of aliases) docs.get(a.feedstockId)?.aliases.push(a.alias);
  for (const p of published) {
    const d = docs.get(p.feedstockId);
    if (d) d.published[p.setting] = p.verdict;
  }
  return [...docs.values()];
}

async function build(version: string): Promise<FeedstockSearchIndex> {
  const index = new FeedstockSearchIndex(await loadSearchDocuments());
  holder.index = index;
  holder.version = version;
  return index;
}

/** The current index, rebuilt when the data version changed. */
export async function getSearchIndex(): Promise<FeedstockSearchIndex> {
  const now = Date.now();
  if (holder.index && now - holder.checkedAt < VERSION_CHECK_MS) return holder.index;
  if (holder.building) return holder.building;
  holder.building = (async () => {
    try {
      const version = await readVersion();
      holder.checkedAt = Date.now();
      if (holder.index && version === holder.version) return holder.index;
      return await build(version);
    } finally {
      holder.building = null;
    }
  })();
  return holder.building;
}

/** Drops this process's index so the next search rebuilds it (call after writing feedstocks). */
export function invalidateSearchIndex(): void {
  holder.checkedAt = 0;
  holder.version = null;
}

/** Searches feedstocks as a person types ("can worms eat orange peels?"). */
export async function searchFeedstocks(query: string, limit = 8): Promise<SearchOutcome> {
  const index = await getSearchIndex();
  return index.search(query, limit);
}
