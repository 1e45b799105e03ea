/**
 * Query and index text normalisation for feedstock search. Pure: no I/O.
 *
 * People ask "can worms eat orange peels?", "are coffee grounds ok for worms",
 * "onion skin worm bin". Both the index and the query go through the same
 * steps, so they meet in the middle:
 *   1. lower case, accents removed, punctuation to spaces;
 *   2. multi-word phrases rewritten ("tea bag" stays, "spring onion" → "onion");
 *   3. (queries only) question words and stop words dropped;
 *   4. each word reduced to a simple singular ("tomatoes" → "tomato");
 *   5. each word mapped through the synonym table ("skin", "rind" → "peel").
 */
import { PHRASE_SYNONYMS, WORD_SYNONYMS } from './synonyms';

/**
 * Words that carry no feedstock meaning in a question about worms. Kept
 * small on purpose: every word here can never be searched for on its own.
 */
export const STOP_WORDS: ReadonlySet<string> = new Set([
  // question scaffolding
  'can', 'could', 'may', 'might', 'should', 'shall', 'will', 'would', 'do', 'does', 'did', 'is', 'are', 'was', 'were', 'be',
  'am', 'isn', 'aren', 'don', 'doesn', 'what', 'which', 'how', 'why', 'when', 'where', 'who', 'whether', 'about', 'if',
  // people and pronouns
  'i', 'me', 'my', 'mine', 'we', 'our', 'us', 'you', 'your', 'they', 'them', 'their', 'it', 'its', 'this', 'that', 'these', 'those',
  // glue words
  'a', 'an', 'the', 'and', 'or', 'of', 'to', 'in', 'into', 'on', 'onto', 'for', 'with', 'at', 'by', 'from', 'too', 'much', 'many',
  'any', 'some', 'all', 'there', 'than', 'then', 'so', 'just', 'also', 'ever', 'again', 'still', 'really', 'very', 'else', 'other',
  // the question's verbs and judgements
  'eat', 'eats', 'eating', 'ate', 'feed', 'feeds', 'feeding', 'fed', 'give', 'giving', 'put', 'putting', 'add', 'adding', 'throw',
  'toss', 'use', 'using', 'like', 'likes', 'want', 'ok', 'okay', 'alright', 'fine', 'safe', 'good', 'bad', 'allowed', 'suitable',
  'right', 'hot', 'warm', 'cold', 'fresh', 'raw', 'harmful', 'toxic', 'poisonous', 'dangerous', 'handle', 'digest', 'go', 'goes', 'get', 'let', 'need', 'tell',
  // the worms and their homes
  'worm', 'worms', 'wormery', 'wormeries', 'wiggler', 'wigglers', 'red', 'redworm', 'redworms', 'tiger', 'nightcrawler',
  'nightcrawlers', 'earthworm', 'earthworms', 'bin', 'bins', 'bed', 'beds', 'tray', 'trays', 'tub', 'farm', 'farms', 'composting',
  'compost', 'vermicompost', 'vermicomposting', 'vermiculture', 'castings', 'pile', 'heap',
  // politeness
  'please', 'thanks', 'hi', 'hello',
]);

/** Irregular plurals the suffix rules get wrong. */
const IRREGULAR: Readonly<Record<string, string>> = {
  leaves: 'leaf',
  loaves: 'loaf',
  halves: 'half',
  knives: 'knife',
  shelves: 'shelf',
  mice: 'mouse',
  geese: 'goose',
  teeth: 'tooth',
  feet: 'foot',
  people: 'person',
  children: 'child',
};

/**
 * A simple English singular: "tomatoes" → "tomato", "berries" → "berry",
 * "peaches" → "peach", "peels" → "peel"; "grass", "hummus", "citrus" stay.
 * Not a full stemmer: only plural endings, which is what search needs.
 */
export function singular(word: string): string {
  const w = word;
  if (IRREGULAR[w]) return IRREGULAR[w];
  if (w.length <= 3) return w;
  if (/ies$/.test(w) && w.length > 4) return `${w.slice(0, -3)}y`;
  if (/(sh|ch|x|z|ss)es$/.test(w)) return w.slice(0, -2);
  if (/(ss|us|is|ous)$/.test(w)) return w;
  if (/oes$/.test(w)) return w.slice(0, -2);
  if (/s$/.test(w)) return w.slice(0, -1);
  return w;
}

/** Lower case, accents stripped, "&" spelt out, everything but letters and digits turned into spaces. */
export function foldText(text: string): string {
  return text
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/&/g, ' and ')
    .replace(/['’`]s\b/g, '') // "worm's" → "worm"
    .replace(/['’`]/g, '')
    .replace(/[^a-z0-9]+/g, ' ')
    .trim();
}

function rewritePhrases(folded: string): string {
  let s = ` ${folded} `;
  for (const [from, to] of PHRASE_SYNONYMS) {
    if (s.includes(` ${from} `)) s = s.split(` ${from} `).join(` ${to} `);
  }
  return s.trim();
}

function mapWord(word: string): string {
  const one = singular(word);
  return WORD_SYNONYMS[one] ?? WORD_SYNONYMS[word] ?? one;
}

/** The words of a stored name, alias, family or category, normalised for matching. */
export function indexTerms(text: string): string[] {
  const folded = rewritePhrases(foldText(text));
  if (!folded) return [];
  return folded
    .split(' ')
    .filter((w) => w && w !== 'and' && w !== 'or' && w !== 'of')
    .map(mapWord)
    .filter(Boolean);
}

/** Normalised form of a stored text as one string (for the search index). */
export function indexText(text: string): string {
  return indexTerms(text).join(' ');
}

/** What is left of a query once question and stop words are dropped. */
export interface NormalisedQuery {
  /** The words searched for, normalised, in the order typed. */
  terms: string[];
  /** `terms` joined by spaces. */
  text: string;
}

/**
 * Normalises a query the way people type it: drops question and stop words,
 * singularises and maps synonyms. "Can worms eat orange peels?" → "orange peel".
 * A query made only of stop words comes back empty.
 */
export function normaliseQuery(query: string): NormalisedQuery {
  const folded = rewritePhrases(foldText(query));
  const terms: string[] = [];
  for (const raw of folded.split(' ')) {
    if (!raw || STOP_WORDS.has(raw)) continue;
    const mapped = mapWord(raw);
    if (!mapped || STOP_WORDS.has(mapped)) continue;
    // "peel peel" after synonym mapping adds nothing
    if (terms[terms.length - 1] === mapped) continue;
    terms.push(mapped);
  }
  return { terms, text: terms.join(' ') };
}
