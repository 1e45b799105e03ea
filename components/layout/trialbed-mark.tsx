/**
 * The Trialbed mark: a raised bed in section — two soil layers, a worm
 * working between them, a sprout on top. Decorative; the name beside it is
 * the accessible text.
 */
export function TrialbedMark({ size = 28, className }: { size?: number; className?: string }) {
  return (
    <svg
      width={size}
      height={size}
      viewBox="0 0 32 32"
      aria-hidden="true"
      focusable="false"
      className={className}
    >
      <path d="M3 13h26l-2.2 14.2a2 2 0 0 1-2 1.8H7.2a2 2 0 0 1-2-1.8Z" fill="#5E5043" />
      <path d="M4.1 20h23.8l-1.1 7.2a2 2 0 0 1-2 1.8H7.2a2 2 0 0 1-2-1.8Z" fill="#2B2119" />
      <path
        d="M8 20.2c1.6-2.6 3.4-2.6 5 0s3.4 2.6 5 0 3.4-2.6 5 0"
        fill="none"
        stroke="#F3DE9A"
        strokeWidth="2"
        strokeLinecap="round"
      />
      <path d="M16 13V7.5" stroke="#3D6432" strokeWidth="2" strokeLinecap="round" />
      <path d="M16 9.5c-3.4 0-5.5-2-5.5-5.5 3.4 0 5.5 2 5.5 5.5Z" fill="#3D6432" />
      <path d="M16 8c0-3 1.9-5 5-5 0 3-1.9 5-5 5Z" fill="#5C8A45" />
    </svg>
  );
}
