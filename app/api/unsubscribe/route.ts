import { NextResponse } from 'next/server';
import { getEnv } from '@/lib/env';
import { errorResponse, privateJson } from '@/lib/http/responses';
import { unsubscribeWithToken } from '@/lib/services/subscriptions';
import { OneClickBodySchema } from '@/lib/validation/subscriptions';

export const dynamic = 'force-dynamic';

/**
 * The List-Unsubscribe URL of every update mail (RFC 2369, RFC 8058).
 *
 * GET never unsubscribes (link checkers and previews fetch URLs on their own):
 * it sends the person to the confirmation page /unsubscribe, whose button does it.
 */
export async function GET(req: Request) {
  const token = new URL(req.url).searchParams.get('token') ?? '';
  const target = new URL('/unsubscribe', getEnv().AUTH_URL);
  if (token) target.searchParams.set('token', token.slice(0, 200));
  return NextResponse.redirect(target, { status: 303, headers: { 'Cache-Control': 'no-store' } });
}

/**
 * RFC 8058 one-click unsubscribe: a mail client POSTs the body
 * `List-Unsubscribe=One-Click` (form-encoded) to the URL. It carries no
 * cookies and comes from the mail provider, not our pages, so there is no
 * session and no same-origin check here: the signed token in the URL does all
 * the work (a forged one gets 403). The answer is 200 and never a redirect
 * (RFC 8058 §3.2: no HTTPS redirects).
 */
export async function POST(req: Request) {
  try {
    let fields: Record<string, unknown> = {};
    try {
      fields = Object.fromEntries((await req.formData()).entries());
    } catch {
      // Not a form body: the schema below names what was expected.
    }
    OneClickBodySchema.parse(fields);
    const token = new URL(req.url).searchParams.get('token') ?? '';
    const outcome = await unsubscribeWithToken({ token });
    return privateJson({
      unsubscribed: true,
      alreadyUnsubscribed: outcome.alreadyUnsubscribed,
      message: outcome.alreadyUnsubscribed ? 'This address was already unsubscribed.' : `Unsubscribed: no more mail about ${outcome.scopes.join(', ')}.`,
    });
  } catch (err) {
    return errorResponse(err);
  }
}
