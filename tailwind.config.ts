import type { Config } from 'tailwindcss';

/*
 * Trialbed palette — our own: loam browns, moss greens, straw, clay, rain slate.
 * Tokens are named by role, never by hue, so a page says `text-verdict-avoid`,
 * not `text-red`. Verdict colours are always paired with an icon and a text
 * label (components/evidence/verdict-badge.tsx): colour is never the only cue.
 *
 * Contrast ratios (WCAG 2.x relative luminance; AA needs 4.5:1 for body text,
 * 3:1 for UI boundaries and focus indicators), computed for the pairs we use:
 *
 *   ink            #2B2119 on surface        #FAF6EE  14.60
 *   ink            #2B2119 on surface-sunken #F1EADC  13.15
 *   ink            #2B2119 on surface-raised #FFFDF8  15.48
 *   ink            #2B2119 on straw          #F3DE9A  11.79  (demo banner)
 *   ink-muted      #5E5043 on surface        #FAF6EE   7.20
 *   ink-muted      #5E5043 on surface-sunken #F1EADC   6.49
 *   ink-muted      #5E5043 on surface-raised #FFFDF8   7.64
 *   accent         #3D6432 on surface        #FAF6EE   6.35  (links)
 *   accent         #3D6432 on surface-sunken #F1EADC   5.72
 *   accent         #3D6432 on surface-raised #FFFDF8   6.73
 *   accent-strong  #2E4D25 on surface        #FAF6EE   8.84  (link hover)
 *   accent-strong  #2E4D25 on accent-soft    #E4EDD9   7.90
 *   accent-ink     #FFFFFF on accent         #3D6432   6.85  (primary button)
 *   accent-ink     #FFFFFF on accent-strong  #2E4D25   9.53  (primary hover)
 *   danger         #9B3320 on surface        #FAF6EE   6.75  (field errors)
 *   danger         #9B3320 on surface-raised #FFFDF8   7.15
 *
 *   verdict-feed        #2F5623 on verdict-feed-soft      #E2EDD3  6.98  (on surface 7.87)
 *   verdict-limit       #634800 on verdict-limit-soft     #F7E8B5  6.98  (on surface 7.93)
 *   verdict-prepare     #25505E on verdict-prepare-soft   #DCE7EA  6.98  (on surface 8.16)
 *   verdict-avoid       #8A2B17 on verdict-avoid-soft     #F5DAD0  6.49  (on surface 7.99)
 *   verdict-unsettled   #4D4740 on verdict-unsettled-soft #E9E4DC  7.24  (on surface 8.50)
 *
 * Non-text (3:1):
 *   line-strong    #857461 on surface        #FAF6EE   4.17  (input borders)
 *   line-strong    #857461 on surface-raised #FFFDF8   4.43
 *   focus          #A4461F on surface        #FAF6EE   5.61  (focus ring, offset from the element)
 *   focus          #A4461F on surface-sunken #F1EADC   5.05
 *   focus          #A4461F on surface-raised #FFFDF8   5.95
 * `line` #DCCFBA is decorative only (dividers, card edges), never the sole
 * boundary of a control.
 */
const palette = {
  surface: {
    DEFAULT: '#FAF6EE', // page background: pale loam paper
    sunken: '#F1EADC', // footer, wells
    raised: '#FFFDF8', // cards, inputs, header
  },
  ink: {
    DEFAULT: '#2B2119', // dark loam: body text
    muted: '#5E5043', // secondary text
  },
  accent: {
    DEFAULT: '#3D6432', // moss: links, primary actions
    strong: '#2E4D25',
    soft: '#E4EDD9',
    ink: '#FFFFFF', // text on accent
  },
  line: {
    DEFAULT: '#DCCFBA',
    strong: '#857461',
  },
  straw: '#F3DE9A', // demo-data banner
  focus: '#A4461F', // clay: focus rings
  danger: '#9B3320', // form errors
  verdict: {
    feed: { DEFAULT: '#2F5623', soft: '#E2EDD3' }, // moss
    limit: { DEFAULT: '#634800', soft: '#F7E8B5' }, // straw / ochre
    prepare: { DEFAULT: '#25505E', soft: '#DCE7EA' }, // rain slate
    avoid: { DEFAULT: '#8A2B17', soft: '#F5DAD0' }, // fired clay
    unsettled: { DEFAULT: '#4D4740', soft: '#E9E4DC' }, // stone
  },
} as const;

const config: Config = {
  content: [
    './app/**/*.{ts,tsx,mdx}',
    './components/**/*.{ts,tsx}',
    './content/**/*.{md,mdx}',
  ],
  theme: {
    extend: {
      colors: palette,
      fontFamily: {
        sans: ['var(--font-body)', 'system-ui', 'Segoe UI', 'Helvetica Neue', 'Arial', 'sans-serif'],
        display: ['var(--font-heading)', 'Georgia', 'Cambria', 'Times New Roman', 'serif'],
      },
      maxWidth: {
        page: '72rem',
        prose: '42rem',
      },
      minHeight: {
        touch: '2.75rem', // 44 px touch target
      },
      minWidth: {
        touch: '2.75rem',
      },
    },
  },
};

export default config;
