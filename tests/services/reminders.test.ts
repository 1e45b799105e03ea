import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Op } from 'sequelize';
import { sequelize } from '@/db';
import { Feedstock, OutboxMessage, Trial, User } from '@/db/models';
import { listTrialsNeedingCheckIns } from '@/lib/queries/trials';
import { queueDueCheckInReminders } from '@/lib/services/reminders';
import { addCheckIn, closeTrial, createTrial } from '@/lib/services/trials';
import { buildFeedstock, buildUser } from '../support/factories';

const actorOf = (u: User) => ({ id: u.id, role: u.role, emailVerified: true, createdAt: u.createdAt });

describe('check-in reminders', () => {
  let owner: User;
  let silent: User;
  let feedstock: Feedstock;
  let weekly: number;
  let closed: number;
  let noMail: number;

  const base = (startDate: string) => ({
    setting: 'bin', preparation: 'raw', provenance: 'home-grown', surfaceArea: { amount: 0.5, unit: 'm2' },
    species: 'eisenia-fetida', dose: { amount: 1, unit: 'kg' }, region: 'Test valley', startDate, checkInEveryDays: 7,
  });
  const keysFor = async (trialId: number) =>
    (await OutboxMessage.findAll({ where: { dedupeKey: { [Op.like]: `check-in-due:${trialId}:%` } }, order: [['id', 'ASC']] })).map((m) => m.dedupeKey);

  beforeAll(async () => {
    owner = await buildUser({ role: 'contributor' });
    silent = await User.create({ name: null, email: null, emailVerified: null, role: 'contributor' });
    feedstock = await buildFeedstock();
    weekly = (await createTrial(actorOf(owner), { feedstockId: feedstock.id, ...base('2026-11-01') })).id;
    closed = (await createTrial(actorOf(owner), { feedstockId: feedstock.id, ...base('2026-11-01') })).id;
    await addCheckIn(actorOf(owner), closed, { observedOn: '2026-11-03', wormActivity: 'many', shareRemainingPct: 0 });
    await closeTrial(actorOf(owner), closed, {});
    noMail = (await createTrial(actorOf(silent), { feedstockId: feedstock.id, ...base('2026-11-01') })).id;
  });
  afterAll(async () => {
    await OutboxMessage.destroy({ where: { feedstockId: feedstock.id } });
    await Trial.destroy({ where: { feedstockId: feedstock.id } });
    await feedstock.destroy();
    await User.destroy({ where: { id: [owner.id, silent.id] } });
    await sequelize.close();
  });

  it('lists the owner’s running trials whose check-in is due (start + k × schedule, after the last check-in)', async () => {
    const now = new Date('2026-11-20T10:00:00Z');
    const due = await listTrialsNeedingCheckIns(owner.id, now);
    expect(due).toEqual([{ trialId: weekly, title: expect.stringContaining(`Trial ${weekly}`), feedstockName: feedstock.name, setting: 'bin', dueAt: '2026-11-08T00:00:00Z' }]);
    // Nothing is due the day before the first due date.
    expect(await listTrialsNeedingCheckIns(owner.id, new Date('2026-11-07T23:59:00Z'))).toEqual([]);
  });

  it('queues one outbox row per trial and due date, however often the job runs', async () => {
    const now = new Date('2026-11-20T10:00:00Z');
    await queueDueCheckInReminders(now);
    await queueDueCheckInReminders(now);
    expect(await keysFor(weekly)).toEqual([`check-in-due:${weekly}:2026-11-08`]);
    expect(await keysFor(closed)).toEqual([]);
    // An owner without an e-mail address gets no mail.
    expect(await keysFor(noMail)).toEqual([]);
    const row = (await OutboxMessage.findOne({ where: { dedupeKey: `check-in-due:${weekly}:2026-11-08` } }))!;
    expect(row).toMatchObject({ kind: 'check-in-due', recipient: owner.email, status: 'pending', feedstockId: feedstock.id });
    expect(row.payload).toMatchObject({ trialId: weekly, dueDate: '2026-11-08', path: `/trials/${weekly}`, feedstockSlug: feedstock.slug });
    // Region only in the payload; no location or account id.
    expect(JSON.stringify(row.payload)).not.toContain(owner.id);
  });

  it('moves on after a check-in: the next due date is queued once it comes', async () => {
    await addCheckIn(actorOf(owner), weekly, { observedOn: '2026-11-16', wormActivity: 'few', shareRemainingPct: 60 });
    expect(await listTrialsNeedingCheckIns(owner.id, new Date('2026-11-20T10:00:00Z'))).toEqual([]);
    const r = await queueDueCheckInReminders(new Date('2026-11-22T06:00:00Z'));
    expect(r.queued).toBeGreaterThanOrEqual(1);
    expect(await keysFor(weekly)).toEqual([`check-in-due:${weekly}:2026-11-08`, `check-in-due:${weekly}:2026-11-22`]);
    expect((await queueDueCheckInReminders(new Date('2026-11-22T06:00:00Z'))).queued).toBe(0);
  });
});
