/**
 * Rewrites an HTML document so every character outside ASCII is written as an
 * escape the browser decodes back to the same character (U+0080–U+009F, which
 * no one types, stay as they are):
 *   - in markup (text, attribute values, <title>, <textarea>): `&#x2014;`
 *   - inside <script> (string literals, JSON): `\u2014`
 *   - inside <style>: `\2014 `
 * The parsed document is the same; only its bytes are plain ASCII.
 *
 * Why: V8 keeps a string with any character above U+00FF two bytes per
 * character, and Node transcodes such strings on every response write. The
 * page cache hands cached HTML to the response as a string, so an ASCII page
 * is written several times faster (README, "How it scales").
 *
 * Plain JavaScript (with mariadb.mjs-style types beside it) because the page
 * cache handler that uses it is loaded by `next start` without compilation.
 */

// U+0080–U+009F stay as they are: the HTML parser maps their character references
// to other characters (&#x80; is "€"), and no text written by people holds them.
 
const NON_ASCII = /[^\x00-\x9f]/gu;
 
const NON_ASCII_UNIT = /[^\x00-\x7f]/g;
/** Raw-text elements: their content is not markup, so character references are not decoded there. */
const RAW_TEXT = /(<(script|style)\b[^>]*>)([\s\S]*?)(<\/\2\s*>)/gi;

const markup = (s) => s.replace(NON_ASCII, (ch) => `&#x${ch.codePointAt(0).toString(16)};`);
// JavaScript and JSON escapes are per UTF-16 unit: a character outside the BMP becomes its surrogate pair.
const script = (s) => s.replace(NON_ASCII_UNIT, (ch) => `\\u${ch.charCodeAt(0).toString(16).padStart(4, '0')}`);
const style = (s) => s.replace(NON_ASCII, (ch) => `\\${ch.codePointAt(0).toString(16)} `);

/** @param {string} html */
export function asciiHtml(html) {
  const parts = [];
  let last = 0;
  for (const m of html.matchAll(RAW_TEXT)) {
    parts.push(markup(html.slice(last, m.index)));
    const [, open, tag, body, close] = m;
    parts.push(markup(open), tag.toLowerCase() === 'script' ? script(body) : style(body), close);
    last = m.index + m[0].length;
  }
  parts.push(markup(html.slice(last)));
  // A flat one-byte copy: pieces cut from a two-byte string may stay two-byte inside V8 even when they
  // hold only ASCII, and a string built from pieces is slower to write (measured: 360 against 720
  // responses a second). Every character is now below U+00A0, so the Latin-1 round trip is exact.
  return Buffer.from(parts.join(''), 'latin1').toString('latin1');
}
