import type { ReactNode } from 'react';
import { formatLoad, withReaderUnits, type Units } from '@/lib/format';

/**
 * Loads in the reader's units without reading a cookie on the server: both
 * forms are in the HTML and CSS shows one (app/globals.css, `units-*`),
 * following `data-units` on <html>, which a tiny script in the root layout
 * sets from the `units` cookie before the first paint. So the feedstock page
 * is the same for every reader and can be served from the page cache.
 * Without JavaScript both forms show ("1.5 kg/m² / 0.31 lb/ft²").
 */
export function Load({ kgM2 }: { kgM2: number }) {
  return <Both metric={formatLoad(kgM2, 'metric')} imperial={formatLoad(kgM2, 'imperial')} />;
}

/** An engine sentence that quotes kg/m², with lb/ft² added for imperial readers. */
export function ReaderUnitsText({ text }: { text: string }) {
  const imperial = withReaderUnits(text, 'imperial');
  if (imperial === text) return <>{text}</>;
  return <Both metric={text} imperial={imperial} />;
}

/** Two inline forms of the same thing; one shows. */
function Both({ metric, imperial }: { metric: ReactNode; imperial: ReactNode }) {
  return (
    <>
      <span className="units-metric">{metric}</span>
      <span className="units-imperial">{imperial}</span>
    </>
  );
}

/** A block drawn once per unit system (charts); `render` must give each its own element ids. */
export function ForEachUnits({ render }: { render: (units: Units) => ReactNode }) {
  return (
    <>
      <div className="units-metric">{render('metric')}</div>
      <div className="units-imperial">{render('imperial')}</div>
    </>
  );
}
