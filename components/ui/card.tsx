import type { ElementType, ReactNode } from 'react';
import { cx } from './class-names';

export type CardProps = {
  /** Element to render: `section`/`article` when the card has its own heading. */
  as?: ElementType;
  id?: string;
  'aria-labelledby'?: string;
  className?: string;
  children: ReactNode;
};

/** A bordered panel on the raised surface. */
export function Card({ as: Tag = 'div', className, children, ...rest }: CardProps) {
  return (
    <Tag
      className={cx('rounded-lg border border-line bg-surface-raised p-4 sm:p-5', className)}
      {...rest}
    >
      {children}
    </Tag>
  );
}
