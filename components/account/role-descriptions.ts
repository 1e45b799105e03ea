import type { Role } from '@/lib/policies';

/** What each role can do, in the words of the product design (PRODUCT.md, "Who uses it"). */
export const ROLE_DESCRIPTIONS: Record<Role, string> = {
  reader: 'Reads everything, subscribes to feedstocks, sets units.',
  contributor: 'Logs feeding trials, proposes verdict changes, votes on proposals, suggests page edits.',
  editor: "Edits page text, approves contributors' suggested edits, creates and merges feedstocks.",
  moderator: 'Decides verdict proposals, hides abusive content, and does everything an editor does.',
  admin: 'Assigns roles and disables accounts, and does everything a moderator does.',
};
