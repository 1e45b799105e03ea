import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { PageText, safeUrl } from '@/components/markdown/page-text';
import { XSS_VECTORS, assertInertHtml } from '../support/xss';

const render = (source: string) => renderToStaticMarkup(createElement(PageText, { source }));

// The one renderer for text people write: markdown in, inert HTML out.
describe('page text renderer', () => {
  it('renders ordinary markdown: paragraphs, headings one level down, lists, emphasis, safe links', () => {
    const out = render('# Soaking\n\nTear it **small**.\n\n- one\n- two\n\n[Cornell](https://example.org/worms) and [a page](/feedstocks/bread)');
    expect(out).toContain('<h2>Soaking</h2>');
    expect(out).toContain('<strong>small</strong>');
    expect(out).toContain('<li>one</li>');
    expect(out).toContain('<a href="https://example.org/worms" rel="nofollow ugc noopener noreferrer">Cornell</a>');
    expect(out).toContain('<a href="/feedstocks/bread">a page</a>');
  });

  it.each(XSS_VECTORS.map((v) => [v]))('renders %j inert', (vector) => {
    const out = render(`Before.\n\n${vector}\n\nAfter.`);
    assertInertHtml(out);
    expect(out).toContain('After.');
  });

  it('renders all the vectors together inert', () => {
    assertInertHtml(render(XSS_VECTORS.join('\n\n')));
  });

  it('has a checker that does catch live HTML (so the passes above mean something)', () => {
    for (const live of ['<script>x</script>', '<img src=x onerror=alert(1)>', '<a href="javascript:alert(1)">x</a>', '<a href="&#106;avascript:x">x</a>', '<p style="color:red">x</p>', '<a href="//evil.example">x</a>']) {
      expect(() => assertInertHtml(live), live).toThrow();
    }
  });

  it('keeps only http(s), mailto and site links', () => {
    expect(safeUrl('https://example.org')).toBe('https://example.org');
    expect(safeUrl('mailto:someone@example.org')).toBe('mailto:someone@example.org');
    expect(safeUrl('/guides/reading-a-verdict')).toBe('/guides/reading-a-verdict');
    expect(safeUrl('#evidence')).toBe('#evidence');
    expect(safeUrl('javascript:alert(1)')).toBe('');
    expect(safeUrl(' JAVA\tSCRIPT:alert(1)')).toBe('');
    expect(safeUrl('data:text/html,hi')).toBe('');
    expect(safeUrl('//evil.example')).toBe('');
    expect(safeUrl('vbscript:x')).toBe('');
  });
});
