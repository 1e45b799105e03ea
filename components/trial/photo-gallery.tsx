/* eslint-disable @next/next/no-img-element -- photos come from our own route with fixed sizes; no image optimiser needed */
import type { PhotoDto } from '@/lib/queries/trials';

/** Thumbnails, each linking to the full-size photo. */
export function PhotoGallery({ photos, label }: { photos: readonly PhotoDto[]; label: string }) {
  if (!photos.length) return null;
  return (
    <ul className="m-0 flex list-none flex-wrap gap-2 p-0" aria-label={label}>
      {photos.map((p, i) => {
        const w = 160;
        const h = Math.max(1, Math.round((p.height / p.width) * w));
        return (
          <li key={p.id}>
            <a href={p.url} className="block rounded-md border border-line bg-surface-sunken p-0.5 hover:border-accent">
              <img
                src={p.thumbUrl}
                width={w}
                height={h}
                loading="lazy"
                decoding="async"
                alt={p.caption || `${label}, photo ${i + 1} of ${photos.length} (opens full size)`}
                className="block h-auto max-h-40 w-40 rounded object-cover"
              />
            </a>
          </li>
        );
      })}
    </ul>
  );
}
