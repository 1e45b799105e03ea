/**
 * The "loading" state shown while a server page renders. Used by segment
 * loading.tsx files, not at the root: a root loading boundary makes every page
 * stream, and a streamed page can no longer answer 308 or 404 (old feedstock
 * addresses must redirect permanently).
 */
export function LoadingState() {
  return (
    <div role="status" className="flex items-center gap-3 py-10 text-lg text-ink-muted">
      <svg
        width="24"
        height="24"
        viewBox="0 0 24 24"
        fill="none"
        stroke="currentColor"
        strokeWidth="2.5"
        strokeLinecap="round"
        aria-hidden="true"
        focusable="false"
        className="animate-spin"
      >
        <path d="M12 3a9 9 0 1 1-9 9" />
      </svg>
      <span>Turning the bed over… loading.</span>
    </div>
  );
}
