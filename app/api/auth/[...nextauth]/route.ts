import type { NextRequest } from 'next/server';
import { handlers } from '@/lib/auth';
import { clientIpFrom } from '@/lib/auth/client-ip';
import { errorResponse } from '@/lib/http/responses';
import { assertSameOrigin } from '@/lib/http/same-origin';
import { enforceSignInMailLimits } from '@/lib/services/rate-limits';
import { SignInRequestSchema } from '@/lib/validation/accounts';

export const dynamic = 'force-dynamic';

/** Auth.js pages and callbacks (session, csrf, the e-mail link callback, sign-out). */
export const GET = handlers.GET;

/** Where Auth.js receives the e-mail sign-in POST (body: email, csrfToken, callbackUrl). */
const isEmailSignIn = (req: NextRequest) => /\/signin\/nodemailer\/?$/.test(req.nextUrl.pathname);

async function readEmail(req: NextRequest): Promise<unknown> {
  const copy = req.clone();
  const type = req.headers.get('content-type') ?? '';
  try {
    if (type.includes('application/json')) return ((await copy.json()) as { email?: unknown } | null)?.email;
    return (await copy.formData()).get('email') ?? undefined;
  } catch {
    return undefined;
  }
}

/**
 * Auth.js POSTs, guarded: a foreign Origin gets 403; the e-mail sign-in gets
 * its address checked (400 with field messages) and counted against the
 * per-address and per-client limits (429 with Retry-After) before Auth.js
 * sends anything. The sign-in form's server action goes through the same
 * limit (app/signin/actions.ts).
 */
export async function POST(req: NextRequest) {
  try {
    assertSameOrigin(req);
    if (isEmailSignIn(req)) {
      const { email } = SignInRequestSchema.pick({ email: true }).parse({ email: await readEmail(req) });
      await enforceSignInMailLimits({ email, clientIp: clientIpFrom(req.headers) });
    }
  } catch (err) {
    return errorResponse(err);
  }
  return handlers.POST(req);
}
