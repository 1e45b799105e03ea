/**
 * The words of Trialbed's update mail: one function per shape (an update, a
 * weekly digest, a check-in reminder, a subscription confirmation), each
 * returning a subject, a plain-text part and an HTML part with the same
 * content. Pure: no database, no network — the outbox worker gathers what
 * they need (lib/mail/outbox-worker.ts) and tests call them directly.
 *
 * Every update mail says what changed and why, links to the page, and says
 * why it was sent ("You get this because you follow Orange peel on Trialbed").
 */

/** The feedstock an event is about, fresh from the database (its current name and address). */
export type MailFeedstock = { name: string; slug: string };

/** Why this reader gets this mail. */
export type MailReason =
  | { kind: 'feedstock'; feedstockName: string; mode: 'immediate' | 'digest' }
  | { kind: 'site'; mode: 'immediate' | 'digest' }
  | { kind: 'digest'; scopes: string[] }
  | { kind: 'trial-owner'; trialId: number; everyDays: number | null }
  | { kind: 'edit-author'; feedstockName: string };

/** One event, in words: what happened, why, and where to read more. */
export type EventDescription = {
  kind: string;
  /** "Orange peel", or null for an event with no feedstock. */
  feedstockName: string | null;
  /** Short words for the subject: "new verdict published". */
  headline: string;
  /** What changed: "Keep out → Small amounts only in open beds, after proposal 12 citing 5 trials." */
  what: string;
  /** Why, or what happens next (the moderator's note, the voting rule …). */
  why: string | null;
  /** The page of the feedstock (absolute), when there is one. */
  pageUrl: string | null;
  /** The most specific link: the proposal, the trial, the page history (absolute). */
  detailUrl: string | null;
  detailLabel: string | null;
  /** When it happened (ISO), for digests. */
  at: string | null;
};

/** A finished mail: subject, plain text, and HTML with the same content. */
export type ComposedMail = { subject: string; text: string; html: string };

const str = (v: unknown): string | undefined => (typeof v === 'string' && v.trim() ? v.trim() : undefined);
const int = (v: unknown): number | undefined => {
  const n = typeof v === 'string' && /^\d+$/.test(v) ? Number(v) : v;
  return typeof n === 'number' && Number.isSafeInteger(n) && n > 0 ? n : undefined;
};
const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** A site path from a payload, only when it is a plain path on this site ("/trials/7"), never another host. */
function sitePath(v: unknown): string | undefined {
  const s = str(v);
  return s && /^\/(?!\/)[A-Za-z0-9/_\-.#?=&%]*$/.test(s) ? s : undefined;
}

const dayFormat = new Intl.DateTimeFormat('en-GB', { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });
const shortDay = new Intl.DateTimeFormat('en-GB', { weekday: 'short', day: 'numeric', month: 'short', timeZone: 'UTC' });

/** "Sunday 31 May 2026" for an ISO date (YYYY-MM-DD); the input itself when it is not one. */
export function formatDay(isoDate: string): string {
  const d = /^\d{4}-\d{2}-\d{2}$/.test(isoDate) ? new Date(`${isoDate}T00:00:00Z`) : null;
  return d && !Number.isNaN(d.getTime()) ? dayFormat.format(d) : isoDate;
}

/**
 * Describes one outbox event in words. Payloads come from several services
 * (proposals, trials, page revisions, reminders), so names are read
 * tolerantly (`feedstockName` or `name`, `feedstockSlug` or `slug`) and the
 * feedstock loaded from the database wins over the payload's copy.
 */
export function describeEvent(
  kind: string,
  payload: Record<string, unknown>,
  { baseUrl, feedstock, at = null }: { baseUrl: string; feedstock: MailFeedstock | null; at?: string | null },
): EventDescription {
  const base = baseUrl.replace(/\/$/, '');
  const name = feedstock?.name ?? str(payload.feedstockName) ?? str(payload.name) ?? null;
  const slug = feedstock?.slug ?? str(payload.feedstockSlug) ?? str(payload.slug);
  const pageUrl = slug ? `${base}/feedstocks/${encodeURIComponent(slug)}` : null;
  const link = (path: string | undefined) => (path ? `${base}${path}` : null);
  const proposalId = int(payload.proposalId);
  const trialId = int(payload.trialId);
  const summary = str(payload.summary);
  const note = str(payload.note);
  const common = { kind, feedstockName: name, pageUrl, at };

  switch (kind) {
    case 'verdict-decided': {
      const approved = payload.decision !== 'rejected';
      return {
        ...common,
        headline: approved ? 'new verdict published' : 'verdict proposal not accepted',
        what: approved
          ? `${summary ?? `The published verdict changed after proposal ${proposalId ?? ''}`.trim()}.`
          : `Proposal ${proposalId ?? ''} was not accepted, so the published verdict stays as it was.`.replace('  ', ' '),
        why: note ? `The moderator's note: “${note}”` : approved ? 'A moderator approved the proposal after the community vote.' : null,
        detailUrl: link(proposalId ? `/proposals/${proposalId}` : undefined),
        detailLabel: proposalId ? `Proposal ${proposalId}, its votes and the trials it cites` : null,
      };
    }
    case 'proposal-opened': {
      const n = int(payload.trialCount) ?? 0;
      return {
        ...common,
        headline: 'verdict proposal opened',
        what: `Proposal ${proposalId ?? ''} suggests: ${summary ?? 'a new verdict'}${n ? `, citing ${plural(n, 'trial')}` : ''}.`,
        why: 'Contributors vote on it and a moderator decides; the published verdict changes only then.',
        detailUrl: link(proposalId ? `/proposals/${proposalId}` : undefined),
        detailLabel: proposalId ? `Read proposal ${proposalId} and vote` : null,
      };
    }
    case 'trial-linked':
      return {
        ...common,
        headline: 'new feeding trial',
        what: `${summary ?? `A new feeding trial${name ? ` of ${name.toLowerCase()}` : ''} was logged`}.`,
        why: 'Every trial counts toward the evidence verdict, which was recomputed at once.',
        detailUrl: link(sitePath(payload.path) ?? (trialId ? `/trials/${trialId}` : undefined)),
        detailLabel: trialId ? `Trial ${trialId}: dose, setting and check-ins` : 'The trial',
      };
    case 'page-edited': {
      const editSummary = str(payload.editSummary);
      const change = str(payload.change);
      const version = int(payload.version);
      return {
        ...common,
        headline: 'page text edited',
        what: change ?? `The page text${name ? ` of ${name}` : ''} was edited${editSummary ? `: “${editSummary}”` : ''}.`,
        why: `An editor published a new version of the page text${version ? ` (version ${version})` : ''}; the history shows every change line by line.`,
        detailUrl: link(sitePath(payload.path) ?? (slug ? `/feedstocks/${encodeURIComponent(slug)}/history` : undefined)),
        detailLabel: 'What changed, line by line',
      };
    }
    case 'edit-rejected':
      return {
        ...common,
        headline: 'your page edit was not accepted',
        what: `An editor did not publish the edit you suggested to the page text${name ? ` of ${name}` : ''}.`,
        why: note ? `The editor's note: “${note}”` : 'The editor left no note.',
        detailUrl: link(sitePath(payload.path) ?? (slug ? `/feedstocks/${encodeURIComponent(slug)}/edit` : undefined)),
        detailLabel: 'Edit the current text again',
      };
    case 'check-in-due': {
      const due = str(payload.dueDate);
      const every = int(payload.checkInEveryDays);
      return {
        ...common,
        headline: 'check-in due',
        what: `Your trial${name ? ` of ${name.toLowerCase()}` : ''}${trialId ? ` (trial ${trialId})` : ''} is due for a check-in${due ? ` on ${formatDay(due)}` : ''}.`,
        why: `Note worm activity, how much is left, heat, mould, smell and pests${every ? `; you chose a check-in every ${plural(every, 'day')}` : ''}. Regular check-ins make the evidence stronger.`,
        detailUrl: link(sitePath(payload.path) ?? (trialId ? `/trials/${trialId}` : undefined)),
        detailLabel: 'Add a check-in',
      };
    }
    default:
      return {
        ...common,
        headline: 'update',
        what: summary ?? `Something changed${name ? ` on the page of ${name}` : ''}.`,
        why: null,
        detailUrl: null,
        detailLabel: null,
      };
  }
}

/** The sentence that says why this mail came. */
export function reasonSentence(reason: MailReason): string {
  switch (reason.kind) {
    case 'feedstock':
      return `You get this because you follow ${reason.feedstockName} on Trialbed (${reason.mode === 'digest' ? 'weekly digest' : 'each update as it happens'}).`;
    case 'site':
      return `You get this because you follow every feedstock on Trialbed (${reason.mode === 'digest' ? 'weekly digest' : 'each update as it happens'}).`;
    case 'digest':
      return `You get this weekly digest because you follow ${joinNames(reason.scopes)} on Trialbed.`;
    case 'edit-author':
      return `You get this because you suggested an edit to the page of ${reason.feedstockName} on Trialbed.`;
    case 'trial-owner':
      return `You get this because you run trial ${reason.trialId} on Trialbed${reason.everyDays ? ` and chose a check-in every ${plural(reason.everyDays, 'day')} when you started it` : ''}. Close or abandon the trial to stop these reminders.`;
  }
}

function joinNames(names: string[]): string {
  const n = [...new Set(names)];
  if (n.length <= 1) return n[0] ?? 'Trialbed';
  return `${n.slice(0, -1).join(', ')} and ${n[n.length - 1]}`;
}

/** Escapes text for HTML (element content and quoted attributes). */
export const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

const INK = '#2B2119';
const ACCENT = '#3D6432';
const MUTED = '#5E5247';

type Footer = { reason: MailReason; unsubscribeUrl: string | null; manageUrl: string | null };

function footerText({ reason, unsubscribeUrl, manageUrl }: Footer): string[] {
  return [
    '—',
    reasonSentence(reason),
    ...(unsubscribeUrl ? [`Unsubscribe with one click: ${unsubscribeUrl}`] : []),
    ...(manageUrl ? [`Change or stop your subscriptions: ${manageUrl}`] : []),
    'Trialbed — feeding-trial evidence for worm keepers',
  ];
}

function footerHtml({ reason, unsubscribeUrl, manageUrl }: Footer): string {
  const links = [
    unsubscribeUrl ? `<a href="${escapeHtml(unsubscribeUrl)}" style="color:${ACCENT}">Unsubscribe</a>` : '',
    manageUrl ? `<a href="${escapeHtml(manageUrl)}" style="color:${ACCENT}">Change or stop your subscriptions</a>` : '',
  ].filter(Boolean);
  return `<hr style="border:none;border-top:1px solid #D9CFC2;margin:24px 0 12px">
<p style="font-size:14px;color:${MUTED}">${escapeHtml(reasonSentence(reason))}${links.length ? `<br>${links.join(' · ')}` : ''}</p>
<p style="font-size:14px;color:${MUTED}">Trialbed — feeding-trial evidence for worm keepers</p>`;
}

function wrapHtml(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(title)}</title></head>
<body style="font-family:system-ui,sans-serif;line-height:1.5;color:${INK};max-width:38rem;margin:0 auto;padding:16px">
${body}
</body></html>`;
}

function eventHtml(e: EventDescription, headingTag: 'h1' | 'h3', heading = e.feedstockName ? `${e.feedstockName}: ${e.headline}` : capitalise(e.headline)): string {
  return `<${headingTag} style="font-size:${headingTag === 'h1' ? 22 : 17}px;margin:16px 0 8px">${escapeHtml(heading)}</${headingTag}>
<p><strong>What changed:</strong> ${escapeHtml(e.what)}</p>
${e.why ? `<p><strong>Why:</strong> ${escapeHtml(e.why)}</p>` : ''}
<p>${[
    e.pageUrl ? `<a href="${escapeHtml(e.pageUrl)}" style="color:${ACCENT};font-weight:bold">Open the page of ${escapeHtml(e.feedstockName ?? 'the feedstock')}</a>` : '',
    e.detailUrl ? `<a href="${escapeHtml(e.detailUrl)}" style="color:${ACCENT}">${escapeHtml(e.detailLabel ?? 'Details')}</a>` : '',
  ]
    .filter(Boolean)
    .join(' · ')}</p>`;
}

function eventText(e: EventDescription): string[] {
  return [
    `What changed: ${e.what}`,
    ...(e.why ? [`Why: ${e.why}`] : []),
    ...(e.pageUrl ? [`The page of ${e.feedstockName ?? 'the feedstock'}: ${e.pageUrl}`] : []),
    ...(e.detailUrl ? [`${e.detailLabel ?? 'Details'}: ${e.detailUrl}`] : []),
  ];
}

const capitalise = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** One update mail (immediate subscribers) or one check-in reminder (trial owners). */
export function composeUpdateMail(event: EventDescription, footer: Footer): ComposedMail {
  const subject =
    event.kind === 'check-in-due'
      ? `Check-in due: your ${event.feedstockName ? `${event.feedstockName.toLowerCase()} ` : ''}trial`
      : `${event.feedstockName ?? 'Trialbed'}: ${event.headline}`;
  const text = [subject, '', ...eventText(event), '', ...footerText(footer)].join('\n');
  const html = wrapHtml(subject, `${eventHtml(event, 'h1')}\n${footerHtml(footer)}`);
  return { subject, text, html };
}

/** The weekly digest: every event of the week for one reader, grouped by feedstock, oldest first. */
export function composeDigestMail(events: EventDescription[], footer: Footer & { periodEnd: Date }): ComposedMail {
  const n = events.length;
  const subject = `Your week on Trialbed: ${plural(n, 'update')}${n ? ` about ${joinNames(events.map((e) => e.feedstockName ?? 'Trialbed'))}` : ''}`;
  const groups = new Map<string, EventDescription[]>();
  for (const e of events) {
    const key = e.feedstockName ?? 'Trialbed';
    groups.set(key, [...(groups.get(key) ?? []), e]);
  }
  const text: string[] = [subject, ''];
  let html = `<h1 style="font-size:22px;margin:16px 0 8px">${escapeHtml(subject)}</h1>`;
  for (const [name, list] of groups) {
    text.push(`== ${name} (${plural(list.length, 'update')})`, '');
    html += `<h2 style="font-size:19px;margin:24px 0 4px;border-bottom:1px solid #D9CFC2">${escapeHtml(name)}</h2>`;
    for (const e of list) {
      const when = e.at ? `${shortDay.format(new Date(e.at))}: ` : '';
      text.push(`* ${when}${capitalise(e.headline)}`, ...eventText(e).map((l) => `  ${l}`), '');
      html += eventHtml(e, 'h3', `${when}${capitalise(e.headline)}`);
    }
  }
  text.push(...footerText(footer));
  return { subject, text: text.join('\n'), html: wrapHtml(subject, `${html}\n${footerHtml(footer)}`) };
}

/** The double opt-in mail a visitor gets after asking to follow a feedstock by e-mail. */
export function composeConfirmationMail({ confirmUrl, scopeName, mode, hours }: { confirmUrl: string; scopeName: string; mode: 'immediate' | 'digest'; hours: number }): ComposedMail {
  const subject = `Confirm: follow ${scopeName} on Trialbed`;
  const how = mode === 'digest' ? 'a weekly digest' : 'an e-mail for each update';
  const text = [
    `Someone — we hope you — asked to follow ${scopeName} on Trialbed by e-mail (${how}).`,
    '',
    'Open this link to confirm:',
    '',
    confirmUrl,
    '',
    `The link works for ${hours} hours. Until you confirm, we send you nothing else.`,
    'If you did not ask for this, ignore this e-mail: without the link nothing happens.',
    '',
    '— Trialbed, feeding-trial evidence for worm keepers',
  ].join('\n');
  const html = wrapHtml(
    subject,
    `<p>Someone — we hope you — asked to follow <strong>${escapeHtml(scopeName)}</strong> on Trialbed by e-mail (${how}).</p>
<p><a href="${escapeHtml(confirmUrl)}" style="color:${ACCENT};font-weight:bold">Confirm and start following ${escapeHtml(scopeName)}</a></p>
<p>The link works for ${hours} hours. Until you confirm, we send you nothing else.<br>If you did not ask for this, ignore this e-mail: without the link nothing happens.</p>`,
  );
  return { subject, text, html };
}
