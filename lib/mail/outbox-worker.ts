/**
 * The outbox worker: sends the mail that services wrote to the `outbox` table
 * in the same transaction as their change, through nodemailer over SMTP
 * (lib/mail/transport.ts: the local capture server by default, a provider in
 * production).
 *
 * - Claims due rows under a lock (SELECT … FOR UPDATE SKIP LOCKED, see
 *   lib/services/outbox.ts), so several workers can run side by side.
 * - Retries failures with exponential backoff (attempts, next_attempt_at,
 *   last_error) and marks a row 'failed' after MAIL_MAX_ATTEMPTS, or at once
 *   when the server refuses the recipient for good (5xx).
 * - Marks each row sent exactly once (fenced by its attempt number). A worker
 *   that dies between the SMTP server's "250 OK" and that mark leaves the row
 *   'sending'; when its lock expires the row is sent again — with the same
 *   Message-ID (<outbox-ID@host>), so the copy is recognisable as a duplicate
 *   and mail systems that de-duplicate by Message-ID drop it.
 * - Runs the weekly digest on its schedule (DIGEST_EVERY_HOURS), and then
 *   forgets addresses that never confirmed (after 30 days).
 *
 * `npm start` runs it next to the app; on its own:
 *   node --conditions=react-server --import tsx lib/mail/outbox-worker.ts            # keep running
 *   node --conditions=react-server --import tsx lib/mail/outbox-worker.ts --once     # send what is due, then exit
 *   node --conditions=react-server --import tsx lib/mail/outbox-worker.ts --digest   # digest now, send, exit
 * (`npm run mail:worker`, `npm run mail:digest`).
 */
import type { SendMailOptions, Transporter } from 'nodemailer';
import { sequelize } from '@/db';
import { Feedstock, Subscription, type OutboxMessage } from '@/db/models';
import { getEnv } from '@/lib/env';
import { SITE_SCOPE_NAME } from '@/lib/queries/subscriptions';
import { claimDueMessages, getOutboxState, markAttemptFailed, markCancelled, markSent, type ClaimedMessage } from '@/lib/services/outbox';
import { runScheduledDigest, runWeeklyDigest, type DigestPayload } from '@/lib/services/digests';
import { queueDueCheckInReminders } from '@/lib/services/reminders';
import { purgeUnconfirmedSubscriptions, UNCONFIRMED_KEEP_DAYS } from '@/lib/services/subscriptions';
import { composeDigestMail, composeUpdateMail, describeEvent, type MailFeedstock, type MailReason } from './templates';
import { createMailTransport } from './transport';

let workerTransport: Transporter | null = null;
/** The worker's own pooled SMTP transport (from SMTP_*), built on first use. */
const defaultTransport = () => (workerTransport ??= createMailTransport({ pool: true }));
import { createUnsubscribeToken, listUnsubscribeHeaders } from './unsubscribe-token';

/** Settings of the worker functions; each defaults from the environment (SMTP_*, AUTH_URL, AUTH_SECRET, MAIL_*). */
export type WorkerOptions = {
  /** Where mail goes; default the SMTP_* transport. */
  transport?: Transporter;
  /** Public address for links (AUTH_URL). */
  baseUrl?: string;
  /** Signs unsubscribe links (AUTH_SECRET). */
  secret?: string;
  from?: string;
  batchSize?: number;
  /** How many mails of a batch are in flight at once (SMTP round trips, not CPU, bound the rate). */
  concurrency?: number;
  /** How long a claim holds a row; a worker that dies releases it when this runs out. */
  lockMs?: number;
  maxAttempts?: number;
  retryBaseMs?: number;
  log?: (line: string) => void;
  /** Test seam: runs after the SMTP server accepted a mail and before the row is marked sent (a throw here is a crash). */
  afterSend?: (claimed: ClaimedMessage) => Promise<void>;
};

type Resolved = Required<Omit<WorkerOptions, 'afterSend' | 'transport'>> & Pick<WorkerOptions, 'afterSend' | 'transport'>;

/** The options with their defaults from the environment; the transport stays as given (built only when sending). */
function resolve(o: WorkerOptions): Resolved {
  const env = getEnv();
  return {
    transport: o.transport,
    baseUrl: (o.baseUrl ?? env.AUTH_URL).replace(/\/$/, ''),
    secret: o.secret ?? env.AUTH_SECRET,
    from: o.from ?? env.MAIL_FROM,
    batchSize: o.batchSize ?? 20,
    concurrency: Math.max(1, o.concurrency ?? 4),
    lockMs: o.lockMs ?? 5 * 60_000,
    maxAttempts: o.maxAttempts ?? env.MAIL_MAX_ATTEMPTS,
    retryBaseMs: o.retryBaseMs ?? env.MAIL_RETRY_BASE_SECONDS * 1000,
    log: o.log ?? ((line) => console.log(`[mail] ${line}`)),
    afterSend: o.afterSend,
  };
}

/** The stable Message-ID of an outbox row: the same on every attempt, so a second delivery is recognisable. */
export function messageIdFor(outboxId: number, baseUrl: string): string {
  return `<outbox-${outboxId}@${new URL(baseUrl).hostname}>`;
}

/** A mail ready for nodemailer, or the reason it must not go out. */
export type RenderedMail = { mail: SendMailOptions } | { cancel: string };

async function feedstocksById(ids: (number | null | undefined)[]): Promise<Map<number, MailFeedstock>> {
  const wanted = [...new Set(ids.filter((id): id is number => typeof id === 'number'))];
  if (!wanted.length) return new Map();
  const rows = await Feedstock.findAll({ where: { id: wanted }, attributes: ['id', 'name', 'slug'] });
  return new Map(rows.map((f) => [f.id, { name: f.name, slug: f.slug }]));
}

/**
 * Builds the mail for one outbox row: words from lib/mail/templates.ts, the
 * stable Message-ID, and for subscription mail the RFC 2369 List-Unsubscribe
 * and RFC 8058 List-Unsubscribe-Post headers with a signed token. Rows whose
 * subscription was stopped come back as `{ cancel }`.
 */
export async function renderOutboxMessage(message: OutboxMessage, options: WorkerOptions = {}): Promise<RenderedMail> {
  const o = resolve(options);
  const host = new URL(o.baseUrl).hostname;
  const headers: Record<string, string | { prepared: boolean; value: string }> = {
    'X-Trialbed-Outbox-Id': String(message.id),
    // RFC 3834: no out-of-office replies to this.
    'Auto-Submitted': 'auto-generated',
  };
  const listHeaders = (token: string, listId: string) => {
    const h = listUnsubscribeHeaders(o.baseUrl, token);
    // Prepared: nodemailer must not fold or encode these; their exact form is what RFC 8058 asks for.
    headers['List-Unsubscribe'] = { prepared: true, value: h['List-Unsubscribe'] };
    headers['List-Unsubscribe-Post'] = { prepared: true, value: h['List-Unsubscribe-Post'] };
    headers['List-Id'] = listId;
    return h.url;
  };
  const manageUrl = `${o.baseUrl}/account`;
  const base = { from: o.from, to: message.recipient, messageId: messageIdFor(message.id, o.baseUrl) };

  if (message.kind === 'weekly-digest') {
    const payload = message.payload as unknown as DigestPayload;
    const subs = payload.subscriptionIds?.length ? await Subscription.findAll({ where: { id: payload.subscriptionIds }, attributes: ['id', 'feedstockId'] }) : [];
    const feedstocks = await feedstocksById([...payload.items.map((i) => i.feedstockId), ...subs.map((s) => s.feedstockId)]);
    const events = payload.items.map((i) => describeEvent(i.kind, i.payload, { baseUrl: o.baseUrl, feedstock: i.feedstockId ? (feedstocks.get(i.feedstockId) ?? null) : null, at: i.at }));
    const scopes = subs.length
      ? subs.map((s) => (s.feedstockId === null ? SITE_SCOPE_NAME : (feedstocks.get(s.feedstockId)?.name ?? 'a feedstock')))
      : events.map((e) => e.feedstockName ?? 'Trialbed');
    const token = createUnsubscribeToken(o.secret, { scope: 'd', id: message.id, email: message.recipient });
    const unsubscribeUrl = listHeaders(token, `Trialbed weekly digest <weekly-digest.${host}>`);
    const mail = composeDigestMail(events, { reason: { kind: 'digest', scopes }, unsubscribeUrl, manageUrl, periodEnd: new Date(payload.periodEnd) });
    return { mail: { ...base, ...mail, headers } };
  }

  const feedstock = message.feedstockId ? ((await feedstocksById([message.feedstockId])).get(message.feedstockId) ?? null) : null;
  const event = describeEvent(message.kind, message.payload ?? {}, { baseUrl: o.baseUrl, feedstock, at: message.createdAt?.toISOString() ?? null });

  if (message.kind === 'check-in-due') {
    const trialId = Number(message.payload?.trialId);
    const everyDays = Number(message.payload?.checkInEveryDays);
    const reason: MailReason = { kind: 'trial-owner', trialId, everyDays: Number.isFinite(everyDays) && everyDays > 0 ? everyDays : null };
    return { mail: { ...base, ...composeUpdateMail(event, { reason, unsubscribeUrl: null, manageUrl: null }), headers } };
  }

  if (message.kind === 'edit-rejected') {
    const reason: MailReason = { kind: 'edit-author', feedstockName: feedstock?.name ?? event.feedstockName ?? 'a feedstock' };
    return { mail: { ...base, ...composeUpdateMail(event, { reason, unsubscribeUrl: null, manageUrl: null }), headers } };
  }

  const sub = message.subscriptionId ? await Subscription.findByPk(message.subscriptionId) : null;
  if (!sub || !sub.confirmedAt || sub.unsubscribedAt) return { cancel: 'Unsubscribed before it was sent.' };
  const reason: MailReason =
    sub.feedstockId === null ? { kind: 'site', mode: sub.mode } : { kind: 'feedstock', feedstockName: feedstock?.name ?? event.feedstockName ?? 'a feedstock', mode: sub.mode };
  const token = createUnsubscribeToken(o.secret, { scope: 's', id: sub.id, email: sub.email });
  const listId = sub.feedstockId === null || !feedstock ? `Trialbed updates <all.feedstocks.${host}>` : `Trialbed: ${feedstock.name.replace(/[<>"]/g, '')} <${feedstock.slug}.feedstocks.${host}>`;
  const unsubscribeUrl = listHeaders(token, listId);
  return { mail: { ...base, ...composeUpdateMail(event, { reason, unsubscribeUrl, manageUrl }), headers } };
}

/** True for an SMTP answer that will not change on retry: the server refused the recipient or the message (5xx). */
function isPermanent(err: unknown): boolean {
  const e = err as { responseCode?: number; code?: string };
  return typeof e?.responseCode === 'number' && e.responseCode >= 500 && e.responseCode < 600 && (e.code === 'EENVELOPE' || e.code === 'EMESSAGE');
}

const describe = (err: unknown) => (err instanceof Error ? `${(err as { code?: string }).code ? `${(err as { code?: string }).code}: ` : ''}${err.message}` : String(err));
const mask = (email: string) => email.replace(/^(.).*@/, '$1…@');

/** What one batch (or a drain) did, counted per outcome. */
export type BatchResult = { claimed: number; sent: number; retried: number; failed: number; cancelled: number };

/**
 * Claims one batch of due rows and sends them: `concurrency` recipients at a
 * time, each recipient's rows in order. A throw from `afterSend` propagates (a simulated crash).
 */
export async function processOutboxBatch(options: WorkerOptions = {}): Promise<BatchResult> {
  const o = resolve(options);
  const transport = o.transport ?? defaultTransport();
  const result: BatchResult = { claimed: 0, sent: 0, retried: 0, failed: 0, cancelled: 0 };
  const claimed = await claimDueMessages({ limit: o.batchSize, lockMs: o.lockMs });
  result.claimed = claimed.length;
  const deliver = async (c: ClaimedMessage) => {
    let rendered: RenderedMail;
    try {
      rendered = await renderOutboxMessage(c.message, o);
    } catch (err) {
      const status = await markAttemptFailed(c, `could not build the mail: ${describe(err)}`, o);
      if (status === 'failed') result.failed++;
      else result.retried++;
      o.log(`outbox ${c.message.id} (${c.message.kind}): could not build the mail: ${describe(err)}`);
      return;
    }
    if ('cancel' in rendered) {
      await markCancelled(c, rendered.cancel);
      result.cancelled++;
      return;
    }
    try {
      const info = await transport.sendMail(rendered.mail);
      const refused = [...(info.rejected ?? [])].filter(Boolean);
      if (refused.length) throw Object.assign(new Error('The mail server refused the recipient.'), { code: 'EENVELOPE', responseCode: 550 });
    } catch (err) {
      const status = await markAttemptFailed(c, describe(err), { ...o, permanent: isPermanent(err) });
      if (status === 'failed') result.failed++;
      else result.retried++;
      o.log(`outbox ${c.message.id} (${c.message.kind}) to ${mask(c.message.recipient)}: attempt ${c.attempt} failed (${describe(err)}); ${status === 'failed' ? 'giving up' : 'will retry'}`);
      return;
    }
    await o.afterSend?.(c);
    if (await markSent(c)) result.sent++;
    else o.log(`outbox ${c.message.id}: sent, but another worker had taken it over (lock expired)`);
  };
  // A few recipients at once; each recipient's mail one after the other, oldest first, so a
  // reader gets "proposal opened" before "verdict decided". One slow recipient holds up no other.
  const byRecipient = new Map<string, ClaimedMessage[]>();
  for (const c of [...claimed].sort((a, b) => a.message.id - b.message.id)) {
    const key = c.message.recipient.toLowerCase();
    byRecipient.set(key, [...(byRecipient.get(key) ?? []), c]);
  }
  const queue = [...byRecipient.values()];
  await Promise.all(
    Array.from({ length: Math.min(o.concurrency, queue.length) }, async () => {
      for (let group = queue.shift(); group; group = queue.shift()) for (const c of group) await deliver(c);
    }),
  );
  return result;
}

const sleep = (ms: number, signal?: AbortSignal) =>
  new Promise<void>((resolveSleep) => {
    if (signal?.aborted) return resolveSleep();
    const onAbort = () => {
      clearTimeout(t);
      resolveSleep();
    };
    const t = setTimeout(() => {
      signal?.removeEventListener('abort', onAbort);
      resolveSleep();
    }, ms);
    signal?.addEventListener('abort', onAbort, { once: true });
  });

/**
 * Sends batches until nothing is due. With `waitForRetries`, also waits for
 * rows in backoff (and for expired locks) until every row is sent, failed or
 * cancelled, or `timeoutMs` passes — "run the worker until idle".
 */
export async function drainOutbox(options: WorkerOptions & { waitForRetries?: boolean; timeoutMs?: number } = {}): Promise<BatchResult> {
  const total: BatchResult = { claimed: 0, sent: 0, retried: 0, failed: 0, cancelled: 0 };
  const deadline = Date.now() + (options.timeoutMs ?? 60_000);
  for (;;) {
    const r = await processOutboxBatch(options);
    for (const k of Object.keys(total) as (keyof BatchResult)[]) total[k] += r[k];
    if (r.claimed) continue;
    if (!options.waitForRetries) return total;
    const { nextDueInMs } = await getOutboxState();
    if (nextDueInMs === null || Date.now() > deadline) return total;
    await sleep(Math.min(Math.max(nextDueInMs, 20), 1_000, Math.max(0, deadline - Date.now())));
  }
}

/** How often the worker looks for trials whose check-in is due (an hour). */
const REMINDERS_EVERY_MS = 60 * 60 * 1000;

/**
 * The long-running loop of `npm run mail:worker`: check-in reminders (hourly), the scheduled digest, then
 * batches while there is work, then a pause of `pollMs`. `stop()` lets the
 * mail in hand finish, then resolves.
 */
export function startOutboxWorker(
  options: WorkerOptions & { pollMs?: number; digestEveryHours?: number; remindersEveryMs?: number } = {},
): { stop: () => Promise<void> } {
  const env = getEnv();
  const o = resolve(options);
  const pollMs = options.pollMs ?? env.MAIL_POLL_MS;
  const digestEveryHours = options.digestEveryHours ?? env.DIGEST_EVERY_HOURS;
  const remindersEveryMs = options.remindersEveryMs ?? REMINDERS_EVERY_MS;
  const abort = new AbortController();
  let remindersAt = 0;
  const done = (async () => {
    while (!abort.signal.aborted) {
      let busy = false;
      try {
        if (Date.now() >= remindersAt) {
          // Check-in reminders for trial owners; each due check-in is queued once (dedupe key), so reruns are harmless.
          remindersAt = Date.now() + remindersEveryMs;
          const r = await queueDueCheckInReminders(new Date());
          if (r.queued) o.log(`queued ${r.queued} check-in reminder(s) (${r.due} trial(s) due)`);
        }
        const digest = await runScheduledDigest(new Date(), digestEveryHours);
        if (digest) {
          o.log(`weekly digest: ${digest.digests} mail(s) covering ${digest.items} update(s)`);
          const purged = await purgeUnconfirmedSubscriptions();
          if (purged) o.log(`forgot ${purged} address(es) that never confirmed within ${UNCONFIRMED_KEEP_DAYS} days`);
        }
        const r = await processOutboxBatch(o);
        busy = r.claimed > 0;
        if (r.claimed) o.log(`sent ${r.sent}, retrying ${r.retried}, failed ${r.failed}, cancelled ${r.cancelled}`);
      } catch (err) {
        o.log(`worker error (will try again): ${describe(err)}`);
      }
      if (!busy) await sleep(pollMs, abort.signal);
    }
  })();
  return {
    stop: async () => {
      abort.abort();
      await done;
    },
  };
}

// Run as a program: `npm run mail:worker` (and `npm start`, as a tracked child).
const isMain = process.argv[1] && /outbox-worker\.[cm]?[jt]s$/.test(process.argv[1]);
if (isMain) {
  const args = new Set(process.argv.slice(2));
  const finish = async (code: number) => {
    await sequelize.close().catch(() => {});
    workerTransport?.close();
    process.exit(code);
  };
  if (args.has('--once') || args.has('--digest')) {
    (async () => {
      if (args.has('--digest')) {
        const d = await runWeeklyDigest(new Date());
        console.log(`[mail] weekly digest: ${d.digests} mail(s) covering ${d.items} update(s)${d.cancelled ? `; ${d.cancelled} cancelled (unsubscribed)` : ''}`);
      }
      const r = await drainOutbox();
      console.log(`[mail] sent ${r.sent}, retrying later ${r.retried}, failed ${r.failed}, cancelled ${r.cancelled}`);
      await finish(0);
    })().catch(async (err) => {
      console.error(`[mail] ${describe(err)}`);
      await finish(1);
    });
  } else {
    const env = getEnv();
    console.log(`[mail] outbox worker: SMTP ${env.SMTP_HOST}:${env.SMTP_PORT}, every ${env.MAIL_POLL_MS} ms, digest every ${env.DIGEST_EVERY_HOURS} h`);
    const worker = startOutboxWorker();
    const stop = () => {
      console.log('[mail] stopping the outbox worker');
      setTimeout(() => process.exit(0), 15_000).unref();
      worker.stop().then(() => finish(0));
    };
    process.once('SIGTERM', stop);
    process.once('SIGINT', stop);
  }
}
