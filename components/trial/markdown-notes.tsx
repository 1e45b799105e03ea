import Markdown from 'react-markdown';
import rehypeSanitize from 'rehype-sanitize';
import { cx } from '@/components/ui/class-names';

/**
 * A keeper's notes, written in Markdown: rendered on the server and
 * sanitised (rehype-sanitize's GitHub-like schema: no raw HTML, scripts,
 * styles or event handlers). Images are dropped, so notes cannot load
 * third-party pictures that track readers; links are marked user content.
 */
export function MarkdownNotes({ source, className }: { source: string; className?: string }) {
  if (!source.trim()) return null;
  return (
    <div className={cx('space-y-2 [&_ol]:list-decimal [&_ol]:pl-5 [&_ul]:list-disc [&_ul]:pl-5 [&_blockquote]:border-l-4 [&_blockquote]:border-line [&_blockquote]:pl-3', className)}>
      <Markdown
        rehypePlugins={[rehypeSanitize]}
        disallowedElements={['img']}
        unwrapDisallowed
        components={{
          a: ({ href, children }) => (
            <a href={href} rel="nofollow ugc noopener noreferrer">
              {children}
            </a>
          ),
          h1: ({ children }) => <p className="font-semibold">{children}</p>,
          h2: ({ children }) => <p className="font-semibold">{children}</p>,
        }}
      >
        {source}
      </Markdown>
    </div>
  );
}
