/**
 * Says the site runs on invented demo data. Shown when TRIALBED_DEMO=1 in
 * the server environment (read when the layout renders: at build time for
 * prerendered pages, per request for dynamic ones).
 */
export function DemoBanner() {
  if (process.env.TRIALBED_DEMO !== '1') return null;
  return (
    <p className="m-0 bg-straw px-4 py-2 text-center text-sm font-semibold text-ink">
      Demo data: the people, gardens and trials on this site are invented.
    </p>
  );
}
