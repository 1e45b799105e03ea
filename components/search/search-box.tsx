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

const defaults = {
  hero: { id: 'search-hero-q', label: 'Can worms eat …?' },
  compact: { id: 'search-compact-q', label: 'Search feedstocks' },
} as const;

/**
 * Feedstock search. For now a plain GET form to /feedstocks?q=… that works
 * without JavaScript; a client autocomplete can replace the inside later
 * while keeping these props.
 */
export function SearchBox({
  variant,
  id,
  label,
  labelAsHeading = false,
  defaultValue,
  className,
}: SearchBoxProps) {
  const inputId = id ?? defaults[variant].id;
  const labelId = `${inputId}-label`;
  const labelText = label ?? defaults[variant].label;
  const isHero = variant === 'hero';

  const labelEl = (
    <label
      id={labelId}
      htmlFor={inputId}
      className={
        isHero
          ? cx(
              'block font-display text-ink',
              labelAsHeading ? 'text-3xl sm:text-4xl' : 'text-xl sm:text-2xl',
            )
          : 'sr-only'
      }
    >
      {labelText}
    </label>
  );

  return (
    <form
      role="search"
      aria-labelledby={labelId}
      action="/feedstocks"
      method="get"
      className={cx(isHero ? 'flex flex-col gap-3' : 'flex items-stretch', className)}
    >
      {isHero && labelAsHeading ? <h1 className="m-0">{labelEl}</h1> : labelEl}
      <div className={cx('flex w-full', isHero ? 'gap-2' : '')}>
        <input
          id={inputId}
          name="q"
          type="search"
          defaultValue={defaultValue}
          autoComplete="off"
          enterKeyHint="search"
          spellCheck={false}
          placeholder={isHero ? 'orange peel, coffee grounds, bread…' : 'Search feedstocks'}
          className={cx(
            'min-w-0 flex-1 border border-line-strong bg-surface-raised text-ink placeholder:text-ink-muted',
            isHero
              ? 'min-h-14 rounded-lg px-4 text-lg'
              : 'min-h-touch rounded-l-md border-r-0 px-3 text-base',
          )}
        />
        <button
          type="submit"
          className={cx(
            'inline-flex shrink-0 items-center justify-center gap-2 bg-accent font-semibold text-accent-ink hover:bg-accent-strong',
            isHero
              ? 'min-h-14 min-w-14 rounded-lg px-4 text-lg sm:px-5'
              : 'min-h-touch min-w-touch rounded-r-md px-3',
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
      </div>
    </form>
  );
}
