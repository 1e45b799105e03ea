/** The same HTML document with every non-ASCII character written as an escape (see ascii-html.mjs). */
export function asciiHtml(html: string): string;
