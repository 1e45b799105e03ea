export { Badge, type BadgeProps, type BadgeTone } from './badge';
export { Button, buttonClasses, type ButtonProps, type ButtonSize, type ButtonVariant } from './button';
export { Card, type CardProps } from './card';
export { cx } from './class-names';
export { Field, type FieldProps } from './field';
export { FilterSelect, optionsOf, type FilterOption, type FilterSelectProps } from './filter-select';
export { LinkButton, type LinkButtonProps } from './link-button';
export { Pagination, type PaginationProps } from './pagination';
export { Table, type TableProps } from './table';
