import type { Metadata, Viewport } from 'next';
import type { ReactNode } from 'react';
import { bodyFont, headingFont } from '@/fonts';
import { SiteFooter } from '@/components/layout/site-footer';
import { AccountNav } from '@/components/layout/account-nav';
import { SiteHeader } from '@/components/layout/site-header';
import { SkipLink } from '@/components/layout/skip-link';
import { UNITS_SCRIPT } from '@/lib/units-cookie';
import './globals.css';

export const metadata: Metadata = {
  // Absolute addresses for Open Graph and feeds; AUTH_URL is the public address (README, configuration).
  metadataBase: new URL(process.env.AUTH_URL ?? 'http://localhost:3000'),
  title: {
    default: 'Trialbed — can my worms eat this?',
    template: '%s · Trialbed',
  },
  description:
    'Can composting worms eat it — how much at once, prepared how, and what to watch for. Verdicts for worm bins, flow-through systems and open beds, worked out from feeding trials that keepers log.',
  applicationName: 'Trialbed',
  icons: { icon: [{ url: '/trialbed-mark.svg', type: 'image/svg+xml' }] },
  // Feed readers find the site's Atom feed from any page.
  alternates: { types: { 'application/atom+xml': [{ url: '/feed.xml', title: 'Trialbed — updates on every feedstock' }] } },
};

export const viewport: Viewport = {
  themeColor: '#FFFDF8',
  width: 'device-width',
  initialScale: 1,
};

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    // suppressHydrationWarning: the script below sets data-units on <html> before React hydrates.
    <html lang="en" className={`${bodyFont.variable} ${headingFont.variable}`} suppressHydrationWarning>
      <head>
        <script dangerouslySetInnerHTML={{ __html: UNITS_SCRIPT }} />
      </head>
      <body className="flex min-h-dvh flex-col">
        <SkipLink />
        <SiteHeader account={(place) => <AccountNav {...place} />} />
        <main id="main" tabIndex={-1} className="mx-auto w-full max-w-page flex-1 px-4 py-8 focus:outline-none">
          {children}
        </main>
        <SiteFooter />
      </body>
    </html>
  );
}
