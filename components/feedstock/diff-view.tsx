import type { DiffPart } from '@/lib/text-diff';

/**
 * A line diff: added lines as <ins> with "+", removed as <del> with "−"
 * (marks and words, not colour alone). Long unchanged runs fold to their
 * first and last two lines.
 */
export function DiffView({ parts, label }: { parts: DiffPart[]; label: string }) {
  const lines: { kind: DiffPart['kind'] | 'fold'; text: string }[] = [];
  for (const p of parts) {
    const ls = p.value.replace(/\n$/, '').split('\n');
    if (p.kind === 'same' && ls.length > 5) {
      lines.push(...ls.slice(0, 2).map((text) => ({ kind: p.kind, text })));
      lines.push({ kind: 'fold', text: `… ${ls.length - 4} unchanged lines …` });
      lines.push(...ls.slice(-2).map((text) => ({ kind: p.kind, text })));
    } else {
      lines.push(...ls.map((text) => ({ kind: p.kind, text })));
    }
  }
  return (
    <div role="region" aria-label={label} tabIndex={0} className="overflow-x-auto rounded-md border border-line bg-surface-raised font-mono text-sm">
      {lines.map((l, i) =>
        l.kind === 'added' ? (
          <ins key={i} className="block whitespace-pre-wrap bg-verdict-feed-soft px-3 no-underline">
            <span aria-hidden="true">+ </span>
            <span className="sr-only">Added: </span>
            {l.text || ' '}
          </ins>
        ) : l.kind === 'removed' ? (
          <del key={i} className="block whitespace-pre-wrap bg-verdict-avoid-soft px-3 line-through decoration-verdict-avoid/60">
            <span aria-hidden="true">− </span>
            <span className="sr-only">Removed: </span>
            {l.text || ' '}
          </del>
        ) : l.kind === 'fold' ? (
          <span key={i} className="block px-3 italic text-ink-muted">
            {l.text}
          </span>
        ) : (
          <span key={i} className="block whitespace-pre-wrap px-3 text-ink">
            <span aria-hidden="true">{'  '}</span>
            {l.text || ' '}
          </span>
        ),
      )}
    </div>
  );
}
