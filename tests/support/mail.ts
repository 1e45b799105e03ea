import { randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import nodemailer, { type Transporter } from 'nodemailer';
import { Feedstock, OutboxMessage, Proposal, Subscription, Trial, type User } from '@/db/models';
import { startCaptureServer, type CaptureServer } from '@/lib/mail/capture-server';
import { headerValues, listCapturedMail, type CapturedMail } from '@/lib/mail/mailbox';
import type { Actor } from '@/lib/policies';

/** A capture SMTP server on a free loopback port with its own mailbox folder, restartable on the same port. */
export async function startTestCapture(): Promise<{
  server: () => CaptureServer;
  port: number;
  dir: string;
  stop: () => Promise<void>;
  restart: () => Promise<void>;
  cleanup: () => Promise<void>;
}> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'trialbed-mail-'));
  let server: CaptureServer | null = await startCaptureServer({ port: 0, dir, keep: 100_000 });
  const port = server.port;
  return {
    server: () => server!,
    port,
    dir,
    stop: async () => {
      await server?.close();
      server = null;
    },
    restart: async () => {
      if (!server) server = await startCaptureServer({ port, dir, keep: 100_000 });
    },
    cleanup: async () => {
      await server?.close();
      server = null;
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** A pooled nodemailer transport to the capture server's port (the worker's `transport` option), as the worker builds by default. */
export function captureTransport(port: number): Transporter {
  return nodemailer.createTransport({ host: '127.0.0.1', port, secure: false, pool: true, maxConnections: 2, connectionTimeout: 2_000, greetingTimeout: 2_000, socketTimeout: 5_000 });
}

/** Every captured mail to `email`, oldest first. */
export function mailsTo(dir: string, email: string): CapturedMail[] {
  return listCapturedMail(dir, { to: email, limit: 1_000 }).reverse();
}

export { headerValues };

/** A unique address on the reserved test domain. */
export const testEmail = (tag: string) => `${tag}-${randomUUID().slice(0, 8)}@example.test`;

/** The Actor the policies see for a user row. */
export const actorOf = (u: User): NonNullable<Actor> => ({ id: u.id, role: u.role, email: u.email, emailVerified: true, createdAt: u.createdAt });

/** A subscription row as the services would leave it. */
export async function buildSubscription(
  feedstock: Feedstock | null,
  { email = testEmail('reader'), mode = 'immediate', confirmed = true, unsubscribed = false, userId = null }: Partial<{ email: string; mode: 'immediate' | 'digest'; confirmed: boolean; unsubscribed: boolean; userId: string | null }> = {},
) {
  return Subscription.create({
    feedstockId: feedstock?.id ?? null,
    email,
    userId,
    mode,
    confirmedAt: confirmed ? new Date() : null,
    unsubscribedAt: unsubscribed ? new Date() : null,
  });
}

/** A finished trial of `feedstock` by `owner`, written directly (no outbox rows): something for proposals to cite. */
export async function buildTrial(feedstock: Feedstock, owner: User, attrs: Partial<{ setting: 'bin' | 'bed' | 'flow-through'; load: number }> = {}) {
  return Trial.create({
    feedstockId: feedstock.id,
    ownerId: owner.id,
    setting: attrs.setting ?? 'bed',
    preparation: 'raw',
    provenance: 'home-grown',
    surfaceAreaM2: 1,
    bedDepthCm: null,
    species: 'eisenia-fetida',
    wormMassKg: null,
    doseAmount: attrs.load ?? 2,
    doseUnit: 'kg',
    doseKg: attrs.load ?? 2,
    surfaceLoadKgM2: attrs.load ?? 2,
    layerDepthCm: null,
    feedRatio: null,
    region: 'Test county',
    startDate: '2026-01-05',
    notes: '',
  });
}

/** Removes what a mail test made: outbox rows, subscriptions, proposals, trials and feedstocks. */
export async function cleanUpMailFixtures({ feedstocks = [], subscriptions = [] }: { feedstocks?: Feedstock[]; subscriptions?: Subscription[] }) {
  const fIds = feedstocks.map((f) => f.id);
  const sIds = subscriptions.map((s) => s.id);
  if (sIds.length) {
    const recipients = (await Subscription.findAll({ where: { id: sIds }, attributes: ['email'] })).map((s) => s.email);
    await OutboxMessage.destroy({ where: { recipient: recipients } });
    await Subscription.destroy({ where: { id: sIds } });
  }
  if (fIds.length) {
    await OutboxMessage.destroy({ where: { feedstockId: fIds } });
    await Subscription.destroy({ where: { feedstockId: fIds } });
    await Proposal.destroy({ where: { feedstockId: fIds } });
    await Trial.destroy({ where: { feedstockId: fIds } });
    await Feedstock.destroy({ where: { id: fIds } });
  }
}
