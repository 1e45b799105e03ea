import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '@/db';
import { EvidenceAggregate, EvidenceVerdict, Feedstock, Trial, User } from '@/db/models';
import { aggregateFeedstock } from '@/lib/evidence';
import { loadTrialInputs } from '@/lib/services/evidence';
import { addCheckIn, closeTrial, createTrial } from '@/lib/services/trials';
import { buildFeedstock, buildUser } from '../support/factories';

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
    const groups = await EvidenceAggregate.findAll({ where: { feedstockId: feedstock.id }, order: [['setting', 'ASC'], ['preparation', 'ASC']] });
    const settings = await EvidenceVerdict.findAll({ where: { feedstockId: feedstock.id }, order: [['setting', 'ASC']] });
    return { groups: groups.map((g) => g.result), settings: settings.map((s) => s.result) };
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
});
