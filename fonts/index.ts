import localFont from 'next/font/local';

/**
 * Site fonts, self-hosted from the .woff2 files beside this module (latin
 * subset, copied from the @fontsource packages). Each exposes a CSS variable
 * that tailwind.config.ts maps to `font-sans` and `font-display`.
 */
export const bodyFont = localFont({
  src: [
    { path: './source-sans-3-latin-400-normal.woff2', weight: '400', style: 'normal' },
    { path: './source-sans-3-latin-600-normal.woff2', weight: '600', style: 'normal' },
    { path: './source-sans-3-latin-700-normal.woff2', weight: '700', style: 'normal' },
  ],
  variable: '--font-body',
  display: 'swap',
  fallback: ['system-ui', 'Segoe UI', 'Helvetica Neue', 'Arial', 'sans-serif'],
});

export const headingFont = localFont({
  src: [{ path: './fraunces-latin-600-normal.woff2', weight: '600', style: 'normal' }],
  variable: '--font-heading',
  display: 'swap',
  fallback: ['Georgia', 'Cambria', 'Times New Roman', 'serif'],
});
