'use client';

import { useId, useMemo, useRef, useState, type KeyboardEvent } from 'react';
import { cx } from '@/components/ui/class-names';
import { controlId, FieldError } from './form-controls';

export type FeedstockOption = { id: number; slug: string; name: string; acceptsVolume: boolean };

export type FeedstockComboboxProps = {
  feedstocks: readonly FeedstockOption[];
  /** Field name of the hidden input holding the chosen id. */
  name?: string;
  defaultId?: number | null;
  error?: string;
  onChange?: (feedstock: FeedstockOption | null) => void;
};

const MAX_OPTIONS = 8;

/**
 * Type to search the feedstocks, then pick one (ARIA 1.2 combobox with a
 * listbox popup): arrows move, Enter picks, Escape closes. The chosen id goes
 * in a hidden input; typing after a pick clears it, so a half-typed name is
 * never submitted as a choice.
 */
export function FeedstockCombobox({ feedstocks, name = 'feedstockId', defaultId = null, error, onChange }: FeedstockComboboxProps) {
  const initial = feedstocks.find((f) => f.id === defaultId) ?? null;
  const [selected, setSelected] = useState<FeedstockOption | null>(initial);
  const [query, setQuery] = useState(initial?.name ?? '');
  const [open, setOpen] = useState(false);
  const [active, setActive] = useState(0);
  const listId = useId();
  const inputRef = useRef<HTMLInputElement>(null);
  const id = controlId(name);
  const hintId = `${id}-hint`;

  const matches = useMemo(() => {
    const q = query.trim().toLowerCase();
    const list = q ? feedstocks.filter((f) => f.name.toLowerCase().includes(q) || f.slug.includes(q.replace(/\s+/g, '-'))) : feedstocks;
    // Names that start with the query first.
    return [...list].sort((a, b) => Number(!a.name.toLowerCase().startsWith(q)) - Number(!b.name.toLowerCase().startsWith(q))).slice(0, MAX_OPTIONS);
  }, [feedstocks, query]);

  function choose(f: FeedstockOption) {
    setSelected(f);
    setQuery(f.name);
    setOpen(false);
    onChange?.(f);
  }

  function onKeyDown(e: KeyboardEvent<HTMLInputElement>) {
    if (e.key === 'ArrowDown') {
      e.preventDefault();
      if (!open) setOpen(true);
      else setActive((a) => Math.min(a + 1, matches.length - 1));
    } else if (e.key === 'ArrowUp') {
      e.preventDefault();
      setActive((a) => Math.max(a - 1, 0));
    } else if (e.key === 'Enter' && open && matches[active]) {
      e.preventDefault();
      choose(matches[active]);
    } else if (e.key === 'Escape') {
      setOpen(false);
    }
  }

  const optionId = (i: number) => `${listId}-opt-${i}`;
  const expanded = open && matches.length > 0;

  return (
    <div className="relative flex flex-col gap-1">
      <label htmlFor={id} className="font-semibold">
        Feedstock <span className="font-normal text-ink-muted">(required)</span>
      </label>
      <p id={hintId} className="text-sm text-ink-muted">
        Start typing, then pick from the list.
      </p>
      <input
        ref={inputRef}
        id={id}
        type="text"
        role="combobox"
        aria-autocomplete="list"
        aria-expanded={expanded}
        aria-controls={listId}
        aria-activedescendant={expanded && matches[active] ? optionId(active) : undefined}
        aria-invalid={error ? true : undefined}
        aria-describedby={[hintId, error ? `${id}-error` : null].filter(Boolean).join(' ')}
        autoComplete="off"
        spellCheck={false}
        value={query}
        onChange={(e) => {
          setQuery(e.target.value);
          setOpen(true);
          setActive(0);
          if (selected) {
            setSelected(null);
            onChange?.(null);
          }
        }}
        onFocus={() => setOpen(true)}
        onBlur={() => setOpen(false)}
        onKeyDown={onKeyDown}
        className={cx(
          'min-h-touch w-full rounded-md border bg-surface-raised px-3 text-base text-ink',
          error ? 'border-2 border-danger' : 'border-line-strong',
        )}
      />
      <input type="hidden" name={name} value={selected ? String(selected.id) : ''} />
      <ul
        id={listId}
        role="listbox"
        aria-label="Feedstocks"
        hidden={!expanded}
        className="absolute inset-x-0 top-full z-30 m-0 mt-1 max-h-80 list-none overflow-auto rounded-md border border-line-strong bg-surface-raised p-1 shadow-lg"
      >
        {matches.map((f, i) => (
          <li
            key={f.id}
            id={optionId(i)}
            role="option"
            aria-selected={i === active}
            // Keep focus in the input so the list stays open until the pick.
            onMouseDown={(e) => e.preventDefault()}
            onClick={() => choose(f)}
            onMouseEnter={() => setActive(i)}
            className={cx('flex min-h-touch cursor-pointer items-center rounded px-3', i === active && 'bg-accent-soft text-accent-strong')}
          >
            {f.name}
          </li>
        ))}
      </ul>
      {selected ? <p className="text-sm text-ink-muted">Chosen: {selected.name}</p> : null}
      <FieldError id={id} error={error} />
    </div>
  );
}
