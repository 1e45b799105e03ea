import { diffLines } from 'diff';

/** A run of lines that stayed, was added or was removed. */
export interface DiffPart {
  kind: 'same' | 'added' | 'removed';
  value: string;
}

/** Line diff of two page texts (the `diff` package), as parts, with changed-line counts. Pure. */
export function diffText(before: string, after: string): { parts: DiffPart[]; added: number; removed: number } {
  const withNl = (s: string) => (s === '' || s.endsWith('\n') ? s : `${s}\n`);
  const changes = diffLines(withNl(before), withNl(after));
  let added = 0;
  let removed = 0;
  const parts: DiffPart[] = changes.map((c) => {
    if (c.added) added += c.count ?? 0;
    if (c.removed) removed += c.count ?? 0;
    return { kind: c.added ? 'added' : c.removed ? 'removed' : 'same', value: c.value };
  });
  return { parts, added, removed };
}
