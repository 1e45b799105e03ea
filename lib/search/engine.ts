/**
 * The feedstock search engine: fuse.js token search (TF-IDF weighted, typo
 * tolerant, word order free) over normalised names, aliases, families and
 * categories. Pure: it takes plain documents and returns plain results, so
 * the quality test and the server use the same code.
 */
import Fuse, { type FuseResult, type IFuseOptions } from 'fuse.js';
import { indexText, normaliseQuery } from './normalise';

export type SearchSetting = 'bin' | 'flow-through' | 'bed';
export type SearchVerdict = 'feed' | 'limit' | 'prepare' | 'avoid' | 'unsettled';

/** One feedstock as the search index sees it. */
export interface SearchDocument {
  id: number;
  slug: string;
  name: string;
  aliases: string[];
  family: string | null;
  category: string;
  /** Reader-facing category words ("Paper and card"). */
  categoryLabel: string;
  summary: string;
  /** Published verdict per setting. */
  published: Partial<Record<SearchSetting, SearchVerdict>>;
}

/** One hit, as the API and the search box show it. */
export interface SearchHit {
  slug: string;
  name: string;
  category: string;
  categoryLabel: string;
  summary: string;
  published: Partial<Record<SearchSetting, SearchVerdict>>;
  /** The alias that matched when the name did not ("orange rind"). */
  matchedAlias: string | null;
  /** 0 = perfect; lower is better. */
  score: number;
}

/** What a search returns. */
export interface SearchOutcome {
  /** The words searched for after normalisation ("orange peel"). */
  terms: string[];
  /** Good matches, best first. */
  results: SearchHit[];
  /** Near misses to offer when there is no good match ("did you mean"). */
  suggestions: SearchHit[];
}

interface IndexRecord {
  doc: number;
  name: string;
  aliases: string[];
  family: string;
  category: string;
}

/** Words of a record, split once when the index is built (used to judge coverage of query words). */
interface RecordWords {
  all: Set<string>;
  name: Set<string>;
  aliases: Set<string>[];
}

const wordsOf = (text: string) => new Set(text.split(' ').filter(Boolean));

/**
 * Matching settings. The threshold lets a word be off by about a third of its
 * letters (bitap errors / pattern length) before it stops matching at all;
 * results are then split into good matches and near misses by ACCEPT_SCORE.
 */
export const FUSE_OPTIONS: IFuseOptions<IndexRecord> = {
  keys: [
    { name: 'name', weight: 3 },
    { name: 'aliases', weight: 2.5 },
    { name: 'family', weight: 1 },
    { name: 'category', weight: 0.5 },
  ],
  useTokenSearch: true,
  tokenMatch: 'any',
  threshold: 0.4,
  ignoreLocation: true,
  includeScore: true,
  minMatchCharLength: 2,
};

/** A hit at or below this score is a match; between it and SUGGEST_SCORE, a suggestion. */
export const ACCEPT_SCORE = 0.45;
/** Near misses whose fuse score is worse than this are not offered at all. */
export const SUGGEST_SCORE = 0.8;
/**
 * How many documents the letter-pair filter hands to fuse: at least this many, and half as many
 * again as the results asked for. The filter already ranks the right page first or second for
 * every query of the quality test, even among 2,000 feedstocks; fuse work grows with this number.
 */
export const MIN_CANDIDATES = 12;
/** The most results a search returns. */
export const MAX_RESULTS = 20;

/** A built index over a set of documents. */
export class FeedstockSearchIndex {
  private readonly records: IndexRecord[];
  private readonly words: RecordWords[];
  /** Letter pair → documents with a word containing it (the candidate filter). */
  private readonly grams = new Map<string, number[]>();
  private readonly cache = new Map<string, SearchOutcome>();
  /** Per-document counter reused by `candidates` (always left at zero). */
  private readonly shared: Uint16Array;
  private static readonly CACHE_SIZE = 500;

  constructor(readonly docs: readonly SearchDocument[]) {
    this.records = docs.map((d, i) => ({
      doc: i,
      name: indexText(d.name),
      aliases: d.aliases.map(indexText),
      family: d.family ? indexText(d.family) : '',
      category: indexText(d.categoryLabel),
    }));
    this.shared = new Uint16Array(this.records.length);
    this.words = this.records.map((r) => ({
      all: wordsOf([r.name, ...r.aliases, r.family, r.category].join(' ')),
      name: wordsOf(r.name),
      aliases: r.aliases.map(wordsOf),
    }));
    for (const r of this.records) {
      const seen = new Set<string>();
      for (const word of [r.name, ...r.aliases, r.family, r.category].join(' ').split(' ')) {
        if (!word) continue;
        for (const g of letterPairs(word)) {
          if (seen.has(g)) continue;
          seen.add(g);
          const list = this.grams.get(g);
          if (list) list.push(r.doc);
          else this.grams.set(g, [r.doc]);
        }
      }
    }
  }

  /** Number of documents in the index. */
  get size(): number {
    return this.docs.length;
  }

  /**
   * Searches for a query as typed. Results of the same normalised query are
   * memoised (bounded), since people retype the same words as they go.
   */
  search(query: string, limit = 8): SearchOutcome {
    const nq = normaliseQuery(query);
    const max = Math.max(1, Math.min(limit, MAX_RESULTS));
    if (nq.terms.length === 0) return { terms: [], results: [], suggestions: [] };
    const key = `${max}|${nq.text}`;
    const hit = this.cache.get(key);
    if (hit) return hit;
    const outcome = this.run(nq.terms, nq.text, max);
    if (this.cache.size >= FeedstockSearchIndex.CACHE_SIZE) this.cache.delete(this.cache.keys().next().value as string);
    this.cache.set(key, outcome);
    return outcome;
  }

  /**
   * Documents worth handing to fuse: those with a word sharing at least half
   * the letter pairs of some query word (a typo changes at most a few pairs).
   * Keeps a search over 2,000 feedstocks to a few dozen fuzzy comparisons.
   */
  private candidates(terms: string[], cap: number): IndexRecord[] {
    // Counters in typed arrays, not maps: common letter pairs ("e ", " s") list most of the index.
    const n = this.records.length;
    const shared = this.shared;
    const score = new Float64Array(n);
    const touched: number[] = [];
    const hit: number[] = [];
    for (const term of terms) {
      const pairs = [...new Set(letterPairs(term))];
      const need = Math.max(2, Math.ceil(pairs.length * 0.5));
      for (const g of pairs) {
        for (const doc of this.grams.get(g) ?? []) if (shared[doc]++ === 0) touched.push(doc);
      }
      for (const doc of touched) {
        if (shared[doc] >= need) {
          if (score[doc] === 0) hit.push(doc);
          score[doc] += shared[doc] / pairs.length;
        }
        shared[doc] = 0;
      }
      touched.length = 0;
    }
    return hit
      .sort((a, b) => score[b] - score[a] || a - b)
      .slice(0, cap)
      .map((doc) => this.records[doc]);
  }

  private run(terms: string[], text: string, max: number): SearchOutcome {
    const pool = this.candidates(terms, Math.max(MIN_CANDIDATES, Math.ceil(max * 1.5)));
    if (pool.length === 0) return { terms, results: [], suggestions: [] };
    const found = new Fuse(pool, FUSE_OPTIONS).search(text, { limit: max * 2 });
    const scored = found.map((r) => ({ ...this.toHit(r, terms), raw: r.score ?? 1 })).sort((a, b) => compareHits(a.hit, b.hit));
    const results = scored.filter((s) => s.hit.score <= ACCEPT_SCORE).slice(0, max).map((s) => s.hit);
    // Near misses are judged on fuse's own score: a badly typed word should still suggest its page.
    // A near miss must share at least one (fuzzily) whole word with the query.
    const suggestions = results.length ? [] : scored.filter((s) => s.raw <= SUGGEST_SCORE && s.covered > 0).slice(0, 3).map((s) => s.hit);
    return { terms, results, suggestions };
  }

  private toHit(r: FuseResult<IndexRecord>, terms: string[]): { hit: SearchHit; covered: number } {
    const d = this.docs[r.item.doc];
    let score = r.score ?? 1;
    // A query word the record lacks entirely costs more than fuse's idf weighting says:
    // "orange peel" must put Orange peel ahead of Banana peel even when "peel" is rarer.
    const w = this.words[r.item.doc];
    const missing = terms.filter((t) => !fuzzyHas(w.all, t)).length;
    const coveredTerms = terms.length - missing;
    score = Math.min(1, score + (0.5 * missing) / terms.length);
    // Name the alias when it explains the match better than the name does.
    let matchedAlias: string | null = null;
    const covered = (set: Set<string>) => terms.filter((t) => fuzzyHas(set, t)).length;
    const byName = covered(w.name);
    if (byName < terms.length) {
      let best = byName;
      w.aliases.forEach((a, i) => {
        const c = covered(a);
        if (c > best) {
          best = c;
          matchedAlias = d.aliases[i] ?? null;
        }
      });
    }
    return {
      hit: {
        slug: d.slug,
        name: d.name,
        category: d.category,
        categoryLabel: d.categoryLabel,
        summary: d.summary,
        published: d.published,
        matchedAlias,
        score: Math.round(score * 1000) / 1000,
      },
      covered: coveredTerms,
    };
  }
}

/** Letter pairs of a word with its edges marked: "oat" → " o", "oa", "at", "t ". */
function letterPairs(word: string): string[] {
  const w = ` ${word} `;
  const out: string[] = [];
  for (let i = 0; i < w.length - 1; i++) out.push(w.slice(i, i + 2));
  return out;
}

function compareHits(a: SearchHit, b: SearchHit): number {
  return a.score - b.score || a.name.length - b.name.length || a.name.localeCompare(b.name);
}

/** True when some word is the term or within one edit per four letters of it. */
function fuzzyHas(words: Set<string>, term: string): boolean {
  if (words.has(term)) return true;
  const allowed = Math.max(1, Math.floor(term.length / 4));
  for (const w of words) {
    if (!w) continue;
    if (w.startsWith(term) || term.startsWith(w) && w.length >= 3) return true;
    if (Math.abs(w.length - term.length) <= allowed && editDistance(w, term, allowed) <= allowed) return true;
  }
  return false;
}

/** Damerau–Levenshtein (optimal string alignment) distance, giving up above `cap`. */
export function editDistance(a: string, b: string, cap = Infinity): number {
  const m = a.length;
  const n = b.length;
  if (Math.abs(m - n) > cap) return cap + 1;
  let prev2: number[] = [];
  let prev = Array.from({ length: n + 1 }, (_, j) => j);
  for (let i = 1; i <= m; i++) {
    const cur = [i];
    let rowMin = i;
    for (let j = 1; j <= n; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let v = Math.min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) v = Math.min(v, prev2[j - 2] + 1);
      cur.push(v);
      if (v < rowMin) rowMin = v;
    }
    if (rowMin > cap) return cap + 1;
    prev2 = prev;
    prev = cur;
  }
  return prev[n];
}
