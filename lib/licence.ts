/** The licence of Trialbed's text and data (pages, exports, API). */
export const CONTENT_LICENCE = {
  name: 'CC BY-SA 4.0',
  url: 'https://creativecommons.org/licenses/by-sa/4.0/',
} as const;
