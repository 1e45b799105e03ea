/** The cookie that keeps a reader's units choice (metric / imperial), read in the browser. */
export const UNITS_COOKIE = 'units';

/** A year, in seconds: how long the units choice is kept. */
export const UNITS_COOKIE_MAX_AGE = 60 * 60 * 24 * 365;

/**
 * Inlined in the root layout's <head>, so it runs before the first paint:
 * copies the `units` cookie to <html data-units>, which picks the shown form
 * of every load (components/feedstock/load.tsx). Pages stay the same for
 * every reader, so they can be cached.
 */
export const UNITS_SCRIPT = `try{var m=document.cookie.match(/(?:^|; )${UNITS_COOKIE}=(imperial|metric)(?:;|$)/);document.documentElement.dataset.units=m?m[1]:'metric'}catch(e){}`;
