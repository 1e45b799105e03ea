import Markdown, { type Components } from 'react-markdown';
import rehypeSanitize, { defaultSchema } from 'rehype-sanitize';
import { cx } from '@/components/ui/class-names';

/*
 * The one renderer for text people write (feedstock pages, previews while
 * editing). Markdown only: raw HTML is dropped, the HTML that markdown makes
 * goes through rehype-sanitize (GitHub's allow-list, tightened below), and
 * every link address is checked. Images are not shown: a picture from an
 * outside server would tell that server who reads the page.
 * Safe in server and client components alike (no hooks, no effects).
 */

const SAFE_PROTOCOLS = ['http', 'https', 'mailto'];

/** Keeps http(s), mailto, in-page and site-relative links; anything else (javascript:, data:, vbscript:, …) becomes empty. */
export function safeUrl(url: string): string {
  // Browsers ignore control characters and whitespace inside a scheme ("java\tscript:"), so judge the cleaned form.
  const cleaned = url.replace(/[\u0000-\u0020\u007f-\u009f]/g, '');
  const colon = cleaned.indexOf(':');
  const firstDelimiter = cleaned.search(/[/?#]/);
  if (colon === -1 || (firstDelimiter !== -1 && colon > firstDelimiter)) {
    // No scheme: relative. Refuse protocol-relative "//host" (another site that looks local).
    return cleaned.startsWith('//') || cleaned.startsWith('\\') ? '' : url;
  }
  const scheme = cleaned.slice(0, colon).toLowerCase();
  return SAFE_PROTOCOLS.includes(scheme) ? url : '';
}

const schema = {
  ...defaultSchema,
  tagNames: (defaultSchema.tagNames ?? []).filter((t) => !['img', 'picture', 'source', 'input', 'details', 'summary'].includes(t)),
  protocols: { ...defaultSchema.protocols, href: SAFE_PROTOCOLS, src: [] },
};

// The page's own h1 is the feedstock name, so text headings start one level down.
const shift = (Tag: 'h2' | 'h3' | 'h4' | 'h5' | 'h6') =>
  function Heading({ children }: { children?: React.ReactNode }) {
    return <Tag>{children}</Tag>;
  };

const components: Components = {
  h1: shift('h2'),
  h2: shift('h3'),
  h3: shift('h4'),
  h4: shift('h5'),
  h5: shift('h6'),
  h6: shift('h6'),
  a({ href, children }) {
    const url = href ? safeUrl(href) : '';
    if (!url) return <span>{children}</span>;
    const external = /^https?:/i.test(url);
    return (
      <a href={url} rel={external ? 'nofollow ugc noopener noreferrer' : undefined}>
        {children}
      </a>
    );
  },
  img() {
    return null;
  },
};

export type PageTextProps = { source: string; className?: string };

/** Renders page text (markdown) safely. */
export function PageText({ source, className }: PageTextProps) {
  return (
    <div className={cx('page-text', className)}>
      <Markdown skipHtml urlTransform={safeUrl} rehypePlugins={[[rehypeSanitize, schema]]} components={components}>
        {source}
      </Markdown>
    </div>
  );
}
