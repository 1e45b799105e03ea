import { createHash } from 'node:crypto';

/**
 * The stable pseudonymous label a contributor appears under on pages, in the
 * JSON API and in exports: ten hex digits of SHA-256 over a fixed prefix and
 * the account id. The same account always gets the same label, so readers can
 * see which trials are independent; the label reveals neither the name, the
 * e-mail nor the account id. (Display names are not shown next to trials:
 * with a region they could place a person.)
 */
export function contributorLabel(userId: string): string {
  return createHash('sha256').update(`trialbed:contributor:${userId}`).digest('hex').slice(0, 10);
}

/** How a contributor label reads on a page. */
export function contributorName(label: string): string {
  return `Contributor ${label}`;
}
