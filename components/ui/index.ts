export { Badge, type BadgeProps, type BadgeTone } from './badge';
export { Button, buttonClasses, type ButtonProps, type ButtonSize, type ButtonVariant } from './button';
export { Card, type CardProps } from './card';
export { cx } from './class-names';
export { Field, type FieldProps } from './field';
export { LinkButton, type LinkButtonProps } from './link-button';
export { Table, type TableProps } from './table';
