import type { ReactNode } from 'react';
import { cx } from './class-names';

export type TableProps = {
  /** Table caption; also names the scroll region for screen readers. */
  caption: string;
  /** Hide the caption visually but keep it for assistive technology. */
  hideCaption?: boolean;
  className?: string;
  /** `<thead>` / `<tbody>` content. */
  children: ReactNode;
};

/**
 * A table in a horizontally scrollable, keyboard-focusable region, so wide
 * tables stay usable at 360 px without breaking the page layout. The box is
 * positioned so absolutely placed children (sr-only text) stay inside it
 * instead of widening the page.
 */
export function Table({ caption, hideCaption, className, children }: TableProps) {
  return (
    <div
      role="region"
      aria-label={caption}
      tabIndex={0}
      className={cx('relative overflow-x-auto rounded-lg border border-line bg-surface-raised', className)}
    >
      <table className="w-full border-collapse text-left text-sm sm:text-base [&_td]:border-t [&_td]:border-line [&_td]:px-3 [&_td]:py-2 [&_th]:px-3 [&_th]:py-2 [&_th]:font-semibold [&_thead_th]:bg-surface-sunken">
        <caption className={cx('px-3 py-2 text-left font-semibold', hideCaption && 'sr-only')}>
          {caption}
        </caption>
        {children}
      </table>
    </div>
  );
}
