import { XMLParser } from 'fast-xml-parser';

/**
 * A small Atom validator for tests: the element rules of RFC 4287 §4.1.1
 * (atom:feed) and §4.1.2 (atom:entry) as quoted in REFERENCES.md §8 (V2),
 * plus the namespace and RFC 3339 dates (§3.3; from memory). Parses with
 * fast-xml-parser, a general-purpose XML parser. Returns the problems found;
 * an empty list means valid.
 */

const ATOM_NS = 'http://www.w3.org/2005/Atom';
// RFC 3339 date-time (RFC 4287 §3.3).
const RFC3339 = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d+)?(Z|[+-]\d{2}:\d{2})$/;

type Node = Record<string, unknown[]> & { '@_rel'?: string; '@_type'?: string; '@_hreflang'?: string; '@_href'?: string; '@_src'?: string; '#text'?: string };

const parser = new XMLParser({
  ignoreAttributes: false,
  attributeNamePrefix: '@_',
  // Every element as an array, so "exactly one" can be counted.
  isArray: (_name, jpath, _isLeaf, isAttribute) => !isAttribute && jpath !== 'feed' && !String(jpath).endsWith('?xml'),
  parseTagValue: false,
});

const count = (n: Node | undefined, name: string) => (Array.isArray(n?.[name]) ? n![name].length : 0);
const text = (v: unknown): string => (typeof v === 'string' ? v : typeof v === 'object' && v && '#text' in v ? String((v as { '#text': unknown })['#text']) : '');
const isAbsoluteIri = (s: string) => /^[a-z][a-z0-9+.-]*:/i.test(s.trim());

/** Parses `xml` with fast-xml-parser (throws on XML that is not well-formed). */
export function parseAtom(xml: string): { feed: Node } {
  return parser.parse(xml, true) as { feed: Node };
}

/** RFC 4287 problems of an Atom document (empty when valid). */
export function validateAtom(xml: string): string[] {
  const problems: string[] = [];
  let doc: { feed?: Node };
  try {
    doc = parseAtom(xml);
  } catch (err) {
    return [`not well-formed XML: ${(err as Error).message}`];
  }
  const feed = doc.feed;
  if (!feed) return ['the root element is not atom:feed'];
  if ((feed as Record<string, unknown>)['@_xmlns'] !== ATOM_NS) problems.push(`feed: namespace is not ${ATOM_NS}`);

  // §4.1.1: exactly one id, title and updated.
  for (const name of ['id', 'title', 'updated']) if (count(feed, name) !== 1) problems.push(`feed: needs exactly one <${name}> (has ${count(feed, name)})`);
  // §4.1.1: at most one each of these.
  for (const name of ['generator', 'icon', 'logo', 'rights', 'subtitle']) if (count(feed, name) > 1) problems.push(`feed: more than one <${name}>`);
  if (count(feed, 'id') === 1 && !isAbsoluteIri(text(feed.id[0]))) problems.push('feed: <id> is not an absolute IRI');
  if (count(feed, 'updated') === 1 && !RFC3339.test(text(feed.updated[0]))) problems.push('feed: <updated> is not an RFC 3339 date-time');
  const links = (feed.link ?? []) as Node[];
  // §4.1.1: SHOULD have one rel="self" (our feeds always do).
  if (links.filter((l) => l['@_rel'] === 'self').length !== 1) problems.push('feed: needs one link rel="self"');
  // §4.1.1: no two alternate links with the same type and hreflang (no rel means alternate, §4.2.7.2).
  const alternates = links.filter((l) => (l['@_rel'] ?? 'alternate') === 'alternate').map((l) => `${l['@_type'] ?? ''}|${l['@_hreflang'] ?? ''}`);
  if (new Set(alternates).size !== alternates.length) problems.push('feed: two alternate links with the same type and hreflang');

  const entries = (feed.entry ?? []) as Node[];
  // §4.1.1: one or more authors, unless every entry has one.
  if (count(feed, 'author') < 1 && !entries.every((e) => count(e, 'author') >= 1)) problems.push('feed: needs an <author> (or one in every entry)');

  entries.forEach((e, i) => {
    const at = `entry ${i + 1}`;
    // §4.1.2: exactly one id, title and updated.
    for (const name of ['id', 'title', 'updated']) if (count(e, name) !== 1) problems.push(`${at}: needs exactly one <${name}> (has ${count(e, name)})`);
    // §4.1.2: at most one each of these.
    for (const name of ['content', 'published', 'rights', 'source', 'summary']) if (count(e, name) > 1) problems.push(`${at}: more than one <${name}>`);
    if (count(e, 'id') === 1 && !isAbsoluteIri(text(e.id[0]))) problems.push(`${at}: <id> is not an absolute IRI`);
    if (count(e, 'updated') === 1 && !RFC3339.test(text(e.updated[0]))) problems.push(`${at}: <updated> is not an RFC 3339 date-time`);
    const elinks = (e.link ?? []) as Node[];
    const hasAlternate = elinks.some((l) => (l['@_rel'] ?? 'alternate') === 'alternate' && !!l['@_href']);
    // §4.1.2: without content, at least one alternate link.
    if (count(e, 'content') === 0 && !hasAlternate) problems.push(`${at}: has neither <content> nor an alternate link`);
    // §4.1.2: summary required when content has src or is Base64 (a non-XML, non-text media type).
    const content = (e.content?.[0] ?? null) as Node | null;
    const ctype = content && typeof content === 'object' ? (content['@_type'] ?? 'text') : 'text';
    const base64 = !['text', 'html', 'xhtml'].includes(ctype) && !/\+xml$|\/xml$|^text\//.test(ctype);
    if (content && typeof content === 'object' && (content['@_src'] || base64) && count(e, 'summary') === 0) problems.push(`${at}: needs a <summary> (content has src or is Base64)`);
    // §4.1.2: an author unless the feed provides one.
    if (count(e, 'author') === 0 && count(feed, 'author') === 0) problems.push(`${at}: needs an <author> (the feed has none)`);
  });
  return problems;
}
