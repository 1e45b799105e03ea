import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { EvidenceAggregate, EvidenceVerdict, Feedstock, Photo, Trial, User } from '@/db/models';
import { createLocalStorage } from '@/lib/storage';
import { deletePhoto, uploadPhoto } from '@/lib/services/photos';
import { aggregateFeedstock, type GroupAggregate, type SettingVerdict } from '@/lib/evidence';
import { loadTrialInputs } from '@/lib/services/evidence';
import { addCheckIn, closeTrial, createTrial, updateTrial } from '@/lib/services/trials';
import { buildFeedstock, buildUser } from '../support/factories';
import { smallPng } from '../support/images';

const actorOf = (u: User) => ({ id: u.id, role: u.role, emailVerified: true, createdAt: u.createdAt });

// The server keeps stored evidence equal to what the pure engine computes from the stored trials.
describe('evidence recompute on trial and check-in writes', () => {
  let owner: User;
  let feedstock: Feedstock;
  beforeAll(async () => {
    owner = await buildUser({ role: 'contributor' });
    feedstock = await buildFeedstock();
  });
  afterAll(async () => {
    await Trial.destroy({ where: { feedstockId: feedstock.id } }); // check-ins cascade
    await feedstock.destroy();
    await owner.destroy();
    await sequelize.close();
  });

  const stored = async () => {
    const groups = await EvidenceAggregate.findAll({ where: { feedstockId: feedstock.id } });
    const settings = await EvidenceVerdict.findAll({ where: { feedstockId: feedstock.id } });
    // Sorted here by name (ORDER BY on an ENUM column sorts by the enum's order, not its text).
    return {
      groups: groups.map((g) => g.result as unknown as GroupAggregate).sort((a, b) => a.setting.localeCompare(b.setting) || a.preparation.localeCompare(b.preparation)),
      settings: settings.map((s) => s.result as unknown as SettingVerdict).sort((a, b) => a.setting.localeCompare(b.setting)),
    };
  };
  const expected = async () => {
    const r = aggregateFeedstock(await loadTrialInputs(feedstock.id));
    const bySetting = (a: { setting: string }, b: { setting: string }) => a.setting.localeCompare(b.setting);
    return {
      groups: [...r.groups].sort((a, b) => a.setting.localeCompare(b.setting) || a.preparation.localeCompare(b.preparation)),
      settings: [...r.settings].sort(bySetting),
    };
  };

  it('changes the stored aggregate exactly as the engine computes it after each write', async () => {
    const trial = await createTrial(actorOf(owner), {
      feedstockId: feedstock.id,
      setting: 'bin',
      preparation: 'chopped',
      provenance: 'home-grown',
      surfaceArea: { amount: 0.25, unit: 'm2' },
      species: 'eisenia-fetida',
      dose: { amount: 1, unit: 'lb' },
      region: 'Test valley',
      startDate: '2026-10-01',
      checkInEveryDays: 7,
    });
    // 1 lb = 0.45359237 kg exactly (NIST SP 811 App. B); over 0.25 m² that is 1.81436948 kg/m².
    expect(trial.surfaceLoadKgM2).toBeCloseTo(1.81436948, 6);
    expect(await stored()).toEqual(await expected());
    const before = (await stored()).groups[0] as { counts: { finished: number } };

    await addCheckIn(actorOf(owner), trial.id, { observedOn: '2026-10-08', wormActivity: 'many', shareRemainingPct: 40, mould: false, smell: 'earthy', moisture: 'damp', pests: ['springtails'] });
    expect(await stored()).toEqual(await expected());
    await addCheckIn(actorOf(owner), trial.id, { observedOn: '2026-10-15', wormActivity: 'swarming', shareRemainingPct: 5, bedTemp: { value: 68, unit: 'F' }, smell: 'earthy', moisture: 'damp' });
    expect(await stored()).toEqual(await expected());

    const closed = await closeTrial(actorOf(owner), trial.id, {});
    expect(closed.confirmedOutcome).toBe('consumed');
    const after = await stored();
    expect(after).toEqual(await expected());
    const group = after.groups[0] as { counts: { finished: number; consumed: number } };
    expect(group.counts.finished).toBe(before.counts.finished + 1);
    expect(group.counts.consumed).toBe(1);
  });

  it('refuses a check-in dated before the start and stores nothing', async () => {
    const trial = await createTrial(actorOf(owner), {
      feedstockId: feedstock.id, setting: 'bed', preparation: 'raw', provenance: 'store-bought',
      surfaceArea: { amount: 2, unit: 'm2' }, species: 'eisenia-andrei', dose: { amount: 4, unit: 'kg' },
      region: 'Test valley', startDate: '2026-10-10',
    });
    const snapshot = await stored();
    await expect(
      addCheckIn(actorOf(owner), trial.id, { observedOn: '2026-10-01', wormActivity: 'few', shareRemainingPct: 90 }),
    ).rejects.toMatchObject({ status: 400, fieldErrors: { observedOn: [expect.stringContaining('before the trial started')] } });
    await expect(
      addCheckIn(actorOf(owner), trial.id, { observedOn: '2026-10-12', wormActivity: 'few', shareRemainingPct: 120 }),
    ).rejects.toMatchObject({ issues: [expect.objectContaining({ path: ['shareRemainingPct'] })] });
    expect(await stored()).toEqual(snapshot);
  });

  it('lets only the owner (or a moderator) add check-ins', async () => {
    const other = await buildUser({ role: 'contributor' });
    const trial = await Trial.findOne({ where: { feedstockId: feedstock.id, setting: 'bed' } });
    await expect(addCheckIn(actorOf(other), trial!.id, { observedOn: '2026-10-12', wormActivity: 'few', shareRemainingPct: 90 })).rejects.toMatchObject({ status: 403 });
    await other.destroy();
  });

  it('follows trial updates: a changed dose and setting move the aggregate exactly as the engine computes it', async () => {
    const trial = await createTrial(actorOf(owner), {
      feedstockId: feedstock.id, setting: 'bin', preparation: 'raw', provenance: 'home-grown',
      surfaceArea: { amount: 1, unit: 'm2' }, species: 'eisenia-fetida', dose: { amount: 1, unit: 'kg' },
      region: 'Test valley', startDate: '2026-10-02',
    });
    await addCheckIn(actorOf(owner), trial.id, { observedOn: '2026-10-09', wormActivity: 'many', shareRemainingPct: 5 });
    expect(await stored()).toEqual(await expected());
    const row = (await Trial.findByPk(trial.id))!;
    // 10 lb on 10 ft²: 4.5359237 kg over 0.9290304 m² (NIST SP 811 App. B, exact factors) = 4.882 kg/m².
    const updated = await updateTrial(actorOf(owner), trial.id, { version: row.version, setting: 'bed', dose: { amount: 10, unit: 'lb' }, surfaceArea: { amount: 10, unit: 'ft2' } });
    expect(updated.surfaceLoadKgM2).toBeCloseTo(4.5359237 / 0.9290304, 5);
    const after = await stored();
    expect(after).toEqual(await expected());
    expect((after.groups as { setting: string; trialIds: string[] }[]).find((g) => g.setting === 'bed' && g.trialIds.includes(String(trial.id)))).toBeTruthy();

    // A stale version is a conflict and changes nothing.
    await expect(updateTrial(actorOf(owner), trial.id, { version: row.version, notes: 'late edit' })).rejects.toMatchObject({ status: 409 });
    expect((await Trial.findByPk(trial.id))!.notes).toBe('');
    // Someone else may not edit it.
    const other = await buildUser({ role: 'contributor' });
    await expect(updateTrial(actorOf(other), trial.id, { version: row.version + 1, notes: 'x' })).rejects.toMatchObject({ status: 403 });
    await other.destroy();
    // The start cannot move after the first check-in.
    await expect(updateTrial(actorOf(owner), trial.id, { version: row.version + 1, startDate: '2026-10-20' })).rejects.toMatchObject({
      status: 400,
      fieldErrors: { startDate: [expect.stringContaining('2026-10-09')] },
    });
  });

  it('counts photos in the certainty and keeps the stored aggregate equal to the engine after photo uploads and deletions', async () => {
    const dir = mkdtempSync(path.join(os.tmpdir(), 'trialbed-recompute-'));
    const storage = createLocalStorage(dir);
    const withPhotos = () => (stored().then((s) => (s.groups as { counts: { withPhotos: number } }[]).reduce((n, g) => n + g.counts.withPhotos, 0)));
    const trial = await Trial.findOne({ where: { feedstockId: feedstock.id, status: 'closed' } });
    const before = await withPhotos();
    const photo = await uploadPhoto(actorOf(owner), trial!.id, await smallPng(), {}, storage);
    expect(await stored()).toEqual(await expected());
    expect(await withPhotos()).toBe(before + 1);
    await deletePhoto(actorOf(owner), photo.id, storage);
    expect(await Photo.count({ where: { trialId: trial!.id } })).toBe(0);
    expect(await stored()).toEqual(await expected());
    expect(await withPhotos()).toBe(before);
    rmSync(dir, { recursive: true, force: true });
  });

  it('refuses bad trials with field messages and stores nothing: negative dose, zero area, unknown feedstock', async () => {
    const count = () => Trial.count({ where: { feedstockId: feedstock.id } });
    const snapshot = { trials: await count(), evidence: await stored() };
    const base = {
      feedstockId: feedstock.id, setting: 'bin', preparation: 'raw', provenance: 'home-grown',
      surfaceArea: { amount: 1, unit: 'm2' }, species: 'eisenia-fetida', dose: { amount: 1, unit: 'kg' },
      region: 'Test valley', startDate: '2026-10-01',
    };
    await expect(createTrial(actorOf(owner), { ...base, dose: { amount: -2, unit: 'kg' } })).rejects.toMatchObject({
      issues: [expect.objectContaining({ path: ['dose', 'amount'], message: 'Dose must be more than zero.' })],
    });
    await expect(createTrial(actorOf(owner), { ...base, surfaceArea: { amount: 0, unit: 'm2' } })).rejects.toMatchObject({
      issues: [expect.objectContaining({ path: ['surfaceArea', 'amount'], message: 'Surface area must be more than zero.' })],
    });
    await expect(createTrial(actorOf(owner), { ...base, feedstockId: 999_999_999 })).rejects.toMatchObject({
      status: 400,
      fieldErrors: { feedstockId: ['No such feedstock.'] },
    });
    await expect(createTrial(null, base)).rejects.toMatchObject({ status: 401 });
    expect(await count()).toBe(snapshot.trials);
    expect(await stored()).toEqual(snapshot.evidence);
  });

  it('pairs trials both ways, only within one feedstock and one keeper', async () => {
    const first = await createTrial(actorOf(owner), {
      feedstockId: feedstock.id, setting: 'bed', preparation: 'pre-composted', provenance: 'home-grown',
      surfaceArea: { amount: 1, unit: 'm2' }, species: 'eisenia-fetida', dose: { amount: 2, unit: 'kg' },
      region: 'Test valley', startDate: '2026-10-05', isControl: true,
    });
    const second = await createTrial(actorOf(owner), {
      feedstockId: feedstock.id, setting: 'bed', preparation: 'raw', provenance: 'home-grown',
      surfaceArea: { amount: 1, unit: 'm2' }, species: 'eisenia-fetida', dose: { amount: 2, unit: 'kg' },
      region: 'Test valley', startDate: '2026-10-05', pairedTrialId: first.id,
    });
    expect((await Trial.findByPk(first.id))!.pairedTrialId).toBe(second.id);
    expect(await stored()).toEqual(await expected());
    const other = await buildUser({ role: 'contributor' });
    const elsewhere = await buildFeedstock();
    await expect(
      createTrial(actorOf(other), { feedstockId: feedstock.id, setting: 'bed', preparation: 'raw', provenance: 'home-grown', surfaceArea: { amount: 1, unit: 'm2' }, species: 'eisenia-fetida', dose: { amount: 2, unit: 'kg' }, region: 'Test valley', startDate: '2026-10-05', pairedTrialId: first.id }),
    ).rejects.toMatchObject({ fieldErrors: { pairedTrialId: ['Pair it with one of your own trials.'] } });
    await expect(
      createTrial(actorOf(owner), { feedstockId: elsewhere.id, setting: 'bed', preparation: 'raw', provenance: 'home-grown', surfaceArea: { amount: 1, unit: 'm2' }, species: 'eisenia-fetida', dose: { amount: 2, unit: 'kg' }, region: 'Test valley', startDate: '2026-10-05', pairedTrialId: first.id }),
    ).rejects.toMatchObject({ fieldErrors: { pairedTrialId: ['Pair it with a trial of the same feedstock.'] } });
    await elsewhere.destroy();
    await other.destroy();
  });
});
