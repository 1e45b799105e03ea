import { z } from 'zod';
import { ROLES } from '@/lib/policies';

/** Shared zod schemas for sign-in, the account page and the admin user page (forms, actions and JSON routes). */

/**
 * Lower-cases and NFKC-normalises an address the way Auth.js does before it
 * looks the user up, so the rate limit and the account see the same string.
 */
export function normaliseEmail(raw: string): string {
  return raw.normalize('NFKC').trim().toLowerCase();
}

/** An e-mail address as typed into the sign-in form. */
export const EmailSchema = z
  .string({ message: 'Enter your e-mail address.' })
  .transform(normaliseEmail)
  .pipe(
    z
      .string()
      .min(1, 'Enter your e-mail address.')
      .max(254, 'That address is too long.')
      .pipe(z.email('Enter an e-mail address like name@example.org.')),
  );

/** A path inside this site to return to after signing in ("/account"); anything else is dropped. */
export const ReturnPathSchema = z
  .string()
  .optional()
  .transform((s) => (s && s.startsWith('/') && !s.startsWith('//') && !s.startsWith('/\\') && s.length <= 500 ? s : undefined));

/** The e-mail sign-in form. */
export const SignInRequestSchema = z.object({
  email: EmailSchema,
  callbackUrl: ReturnPathSchema,
});
export type SignInRequestInput = z.infer<typeof SignInRequestSchema>;

const role = z.enum(ROLES, { message: `Choose one of: ${ROLES.join(', ')}.` });

/** The demo-account shortcut (demo mode only). */
export const DemoSignInSchema = z.object({ role });
export type DemoSignInInput = z.infer<typeof DemoSignInSchema>;

export const UNITS = ['metric', 'imperial'] as const;

/** Settings a signed-in person changes on their account page. */
export const AccountSettingsSchema = z.object(
  {
    units: z.enum(UNITS, { message: 'Choose metric or imperial.' }),
  },
  { message: 'Send the settings as a JSON object.' },
);
export type AccountSettingsInput = z.infer<typeof AccountSettingsSchema>;

/** Accepting the contribution licence: the box must be ticked (form "on", JSON true). */
export const LicenceAcceptSchema = z.object(
  {
    accept: z.union([z.literal(true), z.literal('on'), z.literal('true')], {
      message: 'Tick the box to accept the contribution licence.',
    }),
  },
  { message: 'Send { "accept": true } as a JSON object.' },
);
export type LicenceAcceptInput = z.infer<typeof LicenceAcceptSchema>;

const booleanish = z.union([z.boolean(), z.enum(['true', 'false'])], { message: 'Use true or false.' }).transform((v) => v === true || v === 'true');

/** An admin's change to someone's access: a new role, disabling, or both. */
export const UserAccessUpdateSchema = z
  .object(
    {
      role: role.optional(),
      disabled: booleanish.optional(),
    },
    { message: 'Send the change as a JSON object.' },
  )
  .refine((v) => v.role !== undefined || v.disabled !== undefined, {
    message: 'Send a role, disabled, or both.',
    path: ['role'],
  });
export type UserAccessUpdateInput = z.infer<typeof UserAccessUpdateSchema>;

/** The id of a user in a URL or a form. */
export const UserIdSchema = z.string({ message: 'Missing user.' }).pipe(z.uuid('No such user.'));

/** The admin user list filter. */
export const UserListQuerySchema = z.object({
  q: z.string().trim().max(120, 'Search for at most 120 characters.').optional().default(''),
  page: z.coerce.number({ message: 'Page must be a number.' }).int().min(1).max(10_000).optional().default(1),
});
export type UserListQuery = z.infer<typeof UserListQuerySchema>;
