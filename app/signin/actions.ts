'use server';

import { cookies, headers } from 'next/headers';
import { revalidatePath } from 'next/cache';
import { redirect } from 'next/navigation';
import { signIn, signOut } from '@/lib/auth';
import { clientIpFrom } from '@/lib/auth/client-ip';
import { SESSION_COOKIE_NAMES } from '@/lib/auth/cookies';
import { writeSessionCookie } from '@/lib/auth/session-cookie';
import { toActionState, type ActionState } from '@/lib/errors';
import { startDemoSession } from '@/lib/services/accounts';
import { enforceSignInMailLimits } from '@/lib/services/rate-limits';
import { SignInRequestSchema } from '@/lib/validation/accounts';

/** The sign-in form's state: after success, the address the link went to. */
export type SignInFormState = ActionState & { email?: string };

/**
 * Sends an e-mail sign-in link: validates the address, counts it against the
 * same per-address and per-client limits as the Auth.js route, then lets
 * Auth.js create the token and send the mail.
 */
export async function requestSignInLink(_prev: SignInFormState, formData: FormData): Promise<SignInFormState> {
  // Given back on failure so the form shows what was typed.
  const typed = typeof formData.get('email') === 'string' ? String(formData.get('email')).slice(0, 254) : undefined;
  try {
    const input = SignInRequestSchema.parse({
      email: formData.get('email') ?? undefined,
      callbackUrl: formData.get('callbackUrl') ?? undefined,
    });
    await enforceSignInMailLimits({ email: input.email, clientIp: clientIpFrom(await headers()) });
    const next = await signIn('nodemailer', { email: input.email, redirect: false, redirectTo: input.callbackUrl ?? '/account' });
    const error = new URL(String(next), 'http://localhost').searchParams.get('error');
    if (error === 'AccessDenied') return { ok: false, email: typed, message: 'This address cannot sign in here. If you think that is a mistake, ask the site admins.' };
    if (error) return { ok: false, email: typed, message: 'We could not send the e-mail just now. Please try again in a minute.' };
    return { ok: true, email: input.email, message: `We sent a sign-in link to ${input.email}.` };
  } catch (err) {
    return { ...toActionState(err), email: typed };
  }
}

/**
 * Demo mode only: signs in as the demo account of a role without mail, by
 * opening a database session and setting the Auth.js session cookie.
 */
export async function signInAsDemo(_prev: ActionState, formData: FormData): Promise<ActionState> {
  try {
    const session = await startDemoSession({ role: formData.get('role') ?? undefined });
    // Switching accounts: end the current session first, so its row does not linger.
    const cookieNames = (await cookies()).getAll().map((c) => c.name);
    if (SESSION_COOKIE_NAMES.some((n) => cookieNames.includes(n))) await signOut({ redirect: false });
    await writeSessionCookie(session.sessionToken, session.expires);
  } catch (err) {
    return toActionState(err);
  }
  revalidatePath('/', 'layout');
  redirect('/account');
}

/** Signs out: Auth.js deletes the session row and clears the cookie. */
export async function signOutUser(_prev: ActionState, _formData: FormData): Promise<ActionState> {
  try {
    await signOut({ redirect: false });
  } catch (err) {
    return toActionState(err);
  }
  revalidatePath('/', 'layout');
  redirect('/signin?signed-out=1');
}
