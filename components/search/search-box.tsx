'use client';

import { useRouter } from 'next/navigation';
import { useEffect, useId, useRef, useState, type KeyboardEvent } from 'react';
import useSWR from 'swr';
import { VerdictBadge, type Verdict } from '@/components/evidence/verdict-badge';
import { cx } from '@/components/ui/class-names';

export type SearchBoxProps = {
  /** `hero`: large, labelled question on the home page; `compact`: header. */
  variant: 'hero' | 'compact';
  /** Input id; must be unique on the page (the header renders one per layout). */
  id?: string;
  /** Visible label text. Defaults per variant. */
  label?: string;
  /** Render the label inside an <h1> (the home page's question is its heading). */
  labelAsHeading?: boolean;
  /** Prefill, e.g. the current query on the results page. */
  defaultValue?: string;
  className?: string;
};

type Setting = 'bin' | 'flow-through' | 'bed';

/** One hit as /api/search returns it. */
export type SearchHitView = {
  slug: string;
  name: string;
  categoryLabel: string;
  matchedAlias: string | null;
  published: Partial<Record<Setting, Verdict>>;
};

type SearchResponse = { query: string; terms: string[]; results: SearchHitView[]; suggestions: SearchHitView[] };

const defaults = {
  hero: { id: 'search-hero-q', label: 'Can worms eat …?' },
  compact: { id: 'search-compact-q', label: 'Search feedstocks' },
} as const;

const SETTING_SHORT: Record<Setting, string> = { bin: 'Bin', 'flow-through': 'Flow-through', bed: 'Bed' };
const SETTINGS: Setting[] = ['bin', 'flow-through', 'bed'];

const fetcher = async (url: string): Promise<SearchResponse> => {
  const res = await fetch(url, { headers: { accept: 'application/json' } });
  if (!res.ok) throw new Error(`search failed (${res.status})`);
  return res.json();
};

/** Waits until typing pauses before asking the server. */
function useDebounced(value: string, ms: number): string {
  const [v, setV] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setV(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return v;
}

/** Published verdicts of one hit: setting, then the verdict badge (icon and words). */
function Verdicts({ published }: { published: SearchHitView['published'] }) {
  const settings = SETTINGS.filter((s) => published[s]);
  if (!settings.length) return <span className="text-sm text-ink-muted">No published verdict yet</span>;
  return (
    <span className="flex flex-wrap gap-x-3 gap-y-1 text-sm">
      {settings.map((s) => (
        <span key={s} className="inline-flex items-center gap-1">
          <span className="text-ink-muted">{SETTING_SHORT[s]}:</span>
          <VerdictBadge verdict={published[s]!} size="sm" />
        </span>
      ))}
    </span>
  );
}

/**
 * Feedstock search as a combobox (WAI-ARIA 1.2 pattern): results appear as
 * you type, arrow keys move through them (aria-activedescendant), Enter opens
 * the highlighted feedstock — or the best match — and Escape closes the list.
 * Without JavaScript it is a plain GET form to /search.
 */
export function SearchBox({ variant, id, label, labelAsHeading = false, defaultValue, className }: SearchBoxProps) {
  const router = useRouter();
  const inputId = id ?? defaults[variant].id;
  const labelId = `${inputId}-label`;
  const listId = `${inputId}-list`;
  const statusId = useId();
  const labelText = label ?? defaults[variant].label;
  const isHero = variant === 'hero';

  const [query, setQuery] = useState(defaultValue ?? '');
  const [open, setOpen] = useState(false);
  const rootRef = useRef<HTMLFormElement>(null);
  const debounced = useDebounced(query.trim(), 120);
  const ready = debounced.length >= 2;
  const { data, isLoading } = useSWR(ready ? `/api/search?q=${encodeURIComponent(debounced)}&limit=6` : null, fetcher, {
    keepPreviousData: true,
    revalidateOnFocus: false,
  });
  const current = ready ? data : undefined;
  const results = current?.results ?? [];
  const suggestions = current?.suggestions ?? [];
  const noMatch = !!current && results.length === 0;
  // Options: results, or when nothing matched, the near misses plus "request it".
  const options: Array<{ kind: 'hit'; hit: SearchHitView } | { kind: 'request' }> = noMatch
    ? [...suggestions.map((hit) => ({ kind: 'hit' as const, hit })), { kind: 'request' as const }]
    : results.map((hit) => ({ kind: 'hit' as const, hit }));
  const expanded = open && ready && !!current;
  // Results answer the question they were asked for. While a newer question is being typed or loaded they stay on
  // screen, dimmed, but the keyboard cannot choose one and Enter asks the results page for the new question instead.
  const stale = !!current && current.query !== query.trim();

  // The highlighted option belongs to one set of results: new results start with nothing highlighted.
  const dataKey = current ? `${current.query}|${results.length}|${suggestions.length}` : '';
  const [selection, setSelection] = useState<{ key: string; index: number }>({ key: '', index: -1 });
  const active = selection.key === dataKey ? selection.index : -1;
  const setActive = (next: number | ((prev: number) => number)) =>
    setSelection((s) => {
      const prev = s.key === dataKey ? s.index : -1;
      return { key: dataKey, index: typeof next === 'function' ? next(prev) : next };
    });

  useEffect(() => {
    const onDown = (e: MouseEvent) => {
      if (rootRef.current && !rootRef.current.contains(e.target as Node)) setOpen(false);
    };
    document.addEventListener('mousedown', onDown);
    return () => document.removeEventListener('mousedown', onDown);
  }, []);

  const optionId = (i: number) => `${listId}-opt-${i}`;
  const go = (i: number) => {
    const o = options[i];
    if (!o) return;
    setOpen(false);
    if (o.kind === 'hit') router.push(`/feedstocks/${o.hit.slug}`);
    else router.push(`/feedstocks/request?name=${encodeURIComponent(query.trim())}`);
  };

  const onKeyDown = (e: KeyboardEvent<HTMLInputElement>) => {
    if (e.key === 'ArrowDown') {
      e.preventDefault();
      if (!open) setOpen(true);
      if (options.length && !stale) setActive((a) => (a + 1) % options.length);
    } else if (e.key === 'ArrowUp') {
      e.preventDefault();
      if (options.length && !stale) setActive((a) => (a <= 0 ? options.length - 1 : a - 1));
    } else if (e.key === 'Home' && expanded && active >= 0 && !stale) {
      e.preventDefault();
      setActive(0);
    } else if (e.key === 'End' && expanded && active >= 0 && !stale) {
      e.preventDefault();
      setActive(options.length - 1);
    } else if (e.key === 'Escape') {
      if (expanded) {
        e.preventDefault();
        setOpen(false);
        setActive(-1);
      } else if (query) {
        e.preventDefault();
        setQuery('');
      }
    } else if (e.key === 'Enter') {
      if (expanded && active >= 0 && !stale) {
        e.preventDefault();
        go(active);
      } else if (results.length && !stale) {
        // Enter on a typed question opens the best match.
        e.preventDefault();
        go(0);
      }
      // Otherwise the form submits to /search (results page, suggestions, request form).
    }
  };

  const status = !ready
    ? ''
    : (isLoading && !current) || stale
      ? 'Searching…'
      : noMatch
        ? `No feedstock matches. ${suggestions.length ? `${suggestions.length} near ${suggestions.length === 1 ? 'miss' : 'misses'}.` : ''}`
        : current
          ? `${results.length} ${results.length === 1 ? 'feedstock' : 'feedstocks'} found. Use the arrow keys to choose, Enter to open.`
          : '';

  const labelEl = (
    <label
      id={labelId}
      htmlFor={inputId}
      className={
        isHero ? cx('block font-display text-ink', labelAsHeading ? 'text-3xl sm:text-4xl' : 'text-xl sm:text-2xl') : 'sr-only'
      }
    >
      {labelText}
    </label>
  );

  return (
    <form
      ref={rootRef}
      role="search"
      aria-labelledby={labelId}
      action="/search"
      method="get"
      className={cx(isHero ? 'flex flex-col gap-3' : 'flex items-stretch', className)}
    >
      {isHero && labelAsHeading ? <h1>{labelEl}</h1> : labelEl}
      <div className={cx('relative flex w-full', isHero ? 'gap-2' : '')}>
        <input
          id={inputId}
          name="q"
          type="text"
          role="combobox"
          aria-autocomplete="list"
          aria-expanded={expanded}
          aria-controls={listId}
          aria-activedescendant={expanded && active >= 0 && !stale ? optionId(active) : undefined}
          aria-describedby={statusId}
          value={query}
          onChange={(e) => {
            setQuery(e.target.value);
            setOpen(true);
          }}
          onFocus={() => setOpen(true)}
          onKeyDown={onKeyDown}
          autoComplete="off"
          enterKeyHint="search"
          spellCheck={false}
          maxLength={120}
          placeholder={isHero ? 'orange peel, coffee grounds, bread…' : 'Search feedstocks'}
          className={cx(
            'min-w-0 flex-1 border border-line-strong bg-surface-raised text-ink placeholder:text-ink-muted',
            isHero ? 'min-h-14 rounded-lg px-4 text-lg' : 'min-h-touch rounded-l-md border-r-0 px-3 text-base',
          )}
        />
        <button
          type="submit"
          className={cx(
            'inline-flex shrink-0 items-center justify-center gap-2 bg-accent font-semibold text-accent-ink hover:bg-accent-strong',
            isHero ? 'min-h-14 min-w-14 rounded-lg px-4 text-lg sm:px-5' : 'min-h-touch min-w-touch rounded-r-md px-3',
          )}
        >
          <svg
            width={isHero ? 20 : 18}
            height={isHero ? 20 : 18}
            viewBox="0 0 20 20"
            fill="none"
            stroke="currentColor"
            strokeWidth={2}
            strokeLinecap="round"
            aria-hidden="true"
            focusable="false"
          >
            <circle cx="8.5" cy="8.5" r="5.5" />
            <path d="m12.5 12.5 4.5 4.5" />
          </svg>
          {/* Icon-only below 640 px so the input keeps its width on a phone. */}
          <span className={isHero ? 'sr-only sm:not-sr-only' : 'sr-only'}>Search</span>
        </button>
        <ul
          id={listId}
          role="listbox"
          aria-labelledby={labelId}
          hidden={!expanded}
          aria-busy={stale}
          className={cx(
            'absolute top-full z-50 mt-1 max-h-[70vh] list-none overflow-y-auto rounded-lg border border-line-strong bg-surface-raised p-1 shadow-lg',
            // The header box sits at the right edge: its list opens leftwards and never past the screen.
            isHero ? 'inset-x-0' : 'right-0 w-[min(24rem,calc(100vw-2rem))]',
          )}
        >
          {noMatch ? (
            <li role="presentation" className="px-3 py-2 text-ink-muted">
              No feedstock matches “{query.trim()}”.{suggestions.length ? ' Did you mean:' : ''}
            </li>
          ) : null}
          {options.map((o, i) => (
            <li
              key={o.kind === 'hit' ? o.hit.slug : 'request'}
              id={optionId(i)}
              role="option"
              aria-selected={i === active && !stale}
              onMouseDown={(e) => e.preventDefault()}
              onClick={() => go(i)}
              onMouseMove={() => setActive(i)}
              className={cx(
                'cursor-pointer rounded-md px-3 py-2',
                // Dim the options, not the list: the list's own background must stay opaque over the page.
                stale && 'opacity-60',
                i === active && !stale ? 'bg-accent-soft outline-2 outline-accent' : 'hover:bg-surface-sunken',
              )}
            >
              {o.kind === 'hit' ? (
                <span className="flex flex-col gap-0.5">
                  <span className="font-semibold text-ink">
                    {o.hit.name}
                    {o.hit.matchedAlias ? <span className="font-normal text-ink-muted"> — also called “{o.hit.matchedAlias}”</span> : null}
                  </span>
                  <Verdicts published={o.hit.published} />
                </span>
              ) : (
                <span className="font-semibold text-accent">Request “{query.trim()}” as a new feedstock</span>
              )}
            </li>
          ))}
        </ul>
      </div>
      <p id={statusId} className="sr-only" aria-live="polite">
        {status}
      </p>
    </form>
  );
}
