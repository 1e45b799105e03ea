import { z } from 'zod';
import { EmailSchema, normaliseEmail } from './accounts';

/** Addresses are compared lower-cased and NFKC-normalised, as at sign-in. */
export { normaliseEmail };

/** Shared zod schemas for subscriptions: the subscribe panel, the account page, the unsubscribe route. */

export const SUBSCRIPTION_MODES = ['immediate', 'digest'] as const;
/** Each update as it happens, or a weekly digest. */
export type SubscriptionMode = (typeof SUBSCRIPTION_MODES)[number];

const mode = z.enum(SUBSCRIPTION_MODES, { message: 'Choose each update or a weekly digest.' });

/** A feedstock id, or null/"" / "site" for the whole site. */
const scope = z.preprocess(
  (v) => (v === '' || v === 'site' || v === undefined || v === null ? null : v),
  z.coerce.number({ message: 'Choose a feedstock.' }).int().positive('Choose a feedstock.').max(2 ** 31).nullable(),
);


/** Follow a feedstock (or the whole site): visitors give an address, signed-in readers use their account's. */
export const SubscribeSchema = z.object({
  feedstockId: scope,
  mode: mode.default('immediate'),
  /** Visitors only; an empty field counts as none (the service then asks for it). */
  email: z.preprocess((v) => (typeof v === 'string' && !v.trim() ? undefined : v), EmailSchema.optional()),
});
/** Parsed subscribe input. */
export type SubscribeInput = z.infer<typeof SubscribeSchema>;

/** A confirmation or raw random token as mailed: 32 random bytes, base64url. */
export const ConfirmSubscriptionSchema = z.object({
  token: z.string({ message: 'The confirmation link is incomplete.' }).regex(/^[A-Za-z0-9_-]{43}$/, 'The confirmation link is incomplete or damaged.'),
});

const subscriptionId = z.coerce.number({ message: 'Which subscription?' }).int().positive('Which subscription?').max(2 ** 31);

/** Account page: switch one subscription's mode. */
export const ChangeModeSchema = z.object({ subscriptionId, mode });
/** Account page: stop one subscription. */
export const EndSubscriptionSchema = z.object({ subscriptionId });

/** An unsubscribe token from a mail's link (see lib/mail/unsubscribe-token.ts); checked for shape here, for its MAC by the service. */
export const UnsubscribeTokenSchema = z.object({
  token: z.string({ message: 'The unsubscribe link is incomplete.' }).regex(/^[sd][1-9][0-9]{0,17}\.[A-Za-z0-9_-]{43}$/, 'The unsubscribe link is incomplete or damaged.'),
});

/**
 * The body of an RFC 8058 one-click POST: exactly the pair
 * `List-Unsubscribe=One-Click` (RFC 8058 §3.1), form-encoded.
 */
export const OneClickBodySchema = z.object({
  'List-Unsubscribe': z.literal('One-Click', { message: 'The body must be List-Unsubscribe=One-Click.' }),
});
