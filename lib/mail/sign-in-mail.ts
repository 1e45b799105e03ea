import 'server-only';
import { sendMail } from './transport';

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/** The words of the sign-in mail; plain text first, a small HTML part with the same content. */
export function composeSignInMail({ url, expires }: { url: string; expires: Date }) {
  const hours = Math.max(1, Math.round((expires.getTime() - Date.now()) / 3_600_000));
  const subject = 'Your Trialbed sign-in link';
  const text = [
    'Open this link to sign in to Trialbed:',
    '',
    url,
    '',
    `The link works once and for the next ${hours} hours.`,
    'If you did not ask to sign in, ignore this e-mail: nobody can sign in without the link.',
    '',
    '— Trialbed, feeding-trial evidence for worm keepers',
  ].join('\n');
  const html = `<!doctype html><html><body style="font-family:sans-serif;line-height:1.5;color:#2B2119">
<p>Open this link to sign in to Trialbed:</p>
<p><a href="${escapeHtml(url)}" style="color:#3D6432;font-weight:bold">Sign in to Trialbed</a></p>
<p>The link works once and for the next ${hours} hours.<br>If you did not ask to sign in, ignore this e-mail: nobody can sign in without the link.</p>
</body></html>`;
  return { subject, text, html };
}

/** Sends the e-mail sign-in link (called by Auth.js's e-mail provider). Throws when the mail server refuses it. */
export async function sendSignInMail({ to, url, expires }: { to: string; url: string; expires: Date }): Promise<void> {
  await sendMail({ to, ...composeSignInMail({ url, expires }) });
}
