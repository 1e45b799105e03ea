import 'server-only';
import sharp from 'sharp';

/** Size of a demo placeholder photo (small: the loader makes a couple of hundred). */
export const DEMO_PHOTO_SIZE = { width: 480, height: 360 } as const;

const escapeXml = (s: string) => s.replace(/[<>&'"]/g, (c) => ({ '<': '&lt;', '>': '&gt;', '&': '&amp;', "'": '&apos;', '"': '&quot;' })[c]!);

/** A small deterministic PRNG (mulberry32), so the same trial always gets the same picture. */
function prng(start: number) {
  let a = start >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * A clearly-marked placeholder "photo" for a demo trial: a soil-coloured
 * field with specks, the feedstock's name and "Demo placeholder" drawn as SVG
 * text. Returns a JPEG and its WebP thumbnail, both without metadata, as the
 * upload path would store them.
 */
export async function renderPlaceholderPhoto(opts: { title: string; subtitle: string; pattern: number }): Promise<{ full: Buffer; thumb: Buffer; width: number; height: number }> {
  const { width, height } = DEMO_PHOTO_SIZE;
  const rnd = prng(opts.pattern);
  const soils = ['#4a3527', '#5b4030', '#3f2d21', '#6a4b35'];
  const specks = Array.from({ length: 40 }, () => {
    const x = Math.round(rnd() * width);
    const y = Math.round(rnd() * height);
    const r = 2 + Math.round(rnd() * 9);
    const fill = rnd() < 0.2 ? '#9c7a3c' : rnd() < 0.5 ? '#2e2018' : '#7b5a41';
    return `<ellipse cx="${x}" cy="${y}" rx="${r}" ry="${Math.max(1, r - 2)}" fill="${fill}" opacity="0.8"/>`;
  }).join('');
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}">
  <rect width="100%" height="100%" fill="${soils[opts.pattern % soils.length]}"/>
  ${specks}
  <rect x="24" y="${height - 118}" width="${width - 48}" height="100" rx="10" fill="#FFFDF8" opacity="0.88"/>
  <text x="40" y="${height - 84}" font-family="DejaVu Sans, Liberation Sans, sans-serif" font-size="24" font-weight="bold" fill="#2B2119">${escapeXml(opts.title)}</text>
  <text x="40" y="${height - 56}" font-family="DejaVu Sans, Liberation Sans, sans-serif" font-size="18" fill="#5E5043">${escapeXml(opts.subtitle)}</text>
  <text x="40" y="${height - 32}" font-family="DejaVu Sans, Liberation Sans, sans-serif" font-size="16" font-weight="bold" fill="#8A2B17">Demo placeholder, not a real photo</text>
</svg>`;
  // Rasterise the SVG once, then encode the photo and its thumbnail from the pixels.
  const { data, info } = await sharp(Buffer.from(svg)).removeAlpha().raw().toBuffer({ resolveWithObject: true });
  const raw = { raw: { width: info.width, height: info.height, channels: info.channels } };
  const [full, thumb] = await Promise.all([
    sharp(data, raw).jpeg({ quality: 70 }).toBuffer(),
    sharp(data, raw).resize({ width: 240 }).webp({ quality: 60, effort: 0 }).toBuffer(),
  ]);
  return { full, thumb, width, height };
}
