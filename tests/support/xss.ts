import { expect } from 'vitest';

/**
 * Classic stored-XSS vectors, written into page text (markdown). Collected
 * from common practice (OWASP XSS filter-evasion cheat sheet, from memory).
 */
export const XSS_VECTORS: string[] = [
  '<script>alert(1)</script>',
  '<SCRIPT SRC=https://evil.example/x.js></SCRIPT>',
  '<img src=x onerror=alert(1)>',
  '<svg onload=alert(1)><circle r=5 /></svg>',
  '<svg><script>alert(1)</script></svg>',
  '<iframe srcdoc="<script>alert(1)</script>"></iframe>',
  '<iframe src="javascript:alert(1)"></iframe>',
  '<div style="background:url(javascript:alert(1))">styled</div>',
  '<p style="width: expression(alert(1))">ie expression</p>',
  '<style>body{background:url("javascript:alert(1)")}</style>',
  '<a href="javascript:alert(1)">raw html link</a>',
  '<a href="&#106;avascript:alert(1)">entity link</a>',
  '<object data="javascript:alert(1)"></object>',
  '<embed src="javascript:alert(1)">',
  '<form action="javascript:alert(1)"><button formaction="javascript:alert(1)">go</button></form>',
  '<meta http-equiv="refresh" content="0;url=javascript:alert(1)">',
  '<base href="javascript:/">',
  '<details open ontoggle=alert(1)>x</details>',
  '<math><mtext><table><mglyph><style><img src=x onerror=alert(1)></style></mglyph></table></mtext></math>',
  '<body onload=alert(1)>',
  '<input autofocus onfocus=alert(1)>',
  '[markdown js link](javascript:alert(1))',
  '[upper case](JaVaScRiPt:alert(1))',
  '[tab inside](java\tscript:alert(1))',
  '[entity colon](javascript&colon;alert(1))',
  '[numeric entity](&#106;&#97;&#118;&#97;&#115;&#99;&#114;&#105;&#112;&#116;&#58;alert(1))',
  '[hex entity](&#x6A;avascript:alert(1))',
  '[vbscript](vbscript:msgbox(1))',
  '[data url](data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==)',
  '[protocol relative](//evil.example/steal)',
  '![image js](javascript:alert(1))',
  '![image data](data:image/svg+xml;base64,PHN2ZyBvbmxvYWQ9YWxlcnQoMSk+)',
  '![tracking pixel](https://evil.example/pixel.gif)',
  '<javascript:alert(1)>',
  '[ref link][evil]\n\n[evil]: javascript:alert(1)',
  '[title trick](https://ok.example "onmouseover=alert(1)")',
  '&lt;script&gt;alert(1)&lt;/script&gt; written as entities',
  '`<script>alert(1)</script>` in code',
];

const FORBIDDEN_TAGS = [
  'script', 'iframe', 'frame', 'frameset', 'object', 'embed', 'svg', 'math', 'img', 'image', 'style', 'link', 'meta', 'base',
  'form', 'input', 'button', 'textarea', 'select', 'video', 'audio', 'source', 'details', 'template', 'body', 'html',
];

function decodeEntities(s: string): string {
  return s
    .replace(/&#x([0-9a-f]+);?/gi, (_, h) => String.fromCodePoint(parseInt(h, 16)))
    .replace(/&#(\d+);?/g, (_, d) => String.fromCodePoint(Number(d)))
    .replace(/&colon;/gi, ':')
    .replace(/&tab;/gi, '\t')
    .replace(/&newline;/gi, '\n')
    .replace(/&quot;/g, '"')
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&amp;/g, '&');
}

/**
 * Asserts rendered HTML can run nothing: no dangerous elements, no event
 * handler or style attributes, and every link or source address is http(s),
 * mailto or on this site, judged after decoding entities and dropping the
 * control characters browsers ignore.
 */
export function assertInertHtml(html: string): void {
  for (const m of html.matchAll(/<\s*([a-zA-Z][a-zA-Z0-9:-]*)/g)) {
    expect(FORBIDDEN_TAGS, `element <${m[1]}>`).not.toContain(m[1].toLowerCase());
  }
  for (const m of html.matchAll(/<[^>]+>/g)) {
    const tag = m[0];
    expect(tag, 'event handler attribute').not.toMatch(/\son[a-z]+\s*=/i);
    expect(tag, 'style attribute').not.toMatch(/\sstyle\s*=/i);
    expect(tag, 'srcdoc/formaction/xlink').not.toMatch(/\s(srcdoc|formaction|xlink:href|action|background|dynsrc|lowsrc)\s*=/i);
    for (const a of tag.matchAll(/\s(href|src|data|poster|cite)\s*=\s*"([^"]*)"/gi)) {
      const url = decodeEntities(a[2]).replace(/[\u0000-\u0020\u007f-\u009f]/g, '');
      const scheme = /^([a-z][a-z0-9+.-]*):/i.exec(url)?.[1]?.toLowerCase();
      expect(scheme === undefined || ['http', 'https', 'mailto'].includes(scheme), `${a[1]}="${a[2]}"`).toBe(true);
      expect(url.startsWith('//'), `protocol-relative ${a[1]}="${a[2]}"`).toBe(false);
    }
  }
  // Entities must not smuggle a live tag: decoding the text of the output never creates one React did not write.
  expect(html).not.toMatch(/<script/i);
}
