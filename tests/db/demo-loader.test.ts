import { afterAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { sequelize } from '@/db';
import { AppMeta, EvidenceAggregate, Photo } from '@/db/models';
import { getStorage } from '@/lib/storage';
import { DEMO_MARKER, loadDemoScenario } from '@/db/seeders/load-demo';
import { DEMO_FEEDSTOCKS, DEMO_PEOPLE, DEMO_TRIALS } from '@/db/seeders/demo-scenario';

const TABLES = ['users', 'feedstocks', 'feedstock_aliases', 'trials', 'check_ins', 'photos', 'proposals', 'votes', 'published_verdicts',
  'verdict_history', 'feedstock_requests', 'evidence_aggregates', 'evidence_verdicts', 'subscriptions'];

async function counts() {
  const out: Record<string, number> = {};
  for (const t of TABLES) {
    const [row] = await sequelize.query<{ n: number }>(`SELECT COUNT(*) AS n FROM ${t}`, { type: QueryTypes.SELECT });
    out[t] = Number(row.n);
  }
  return out;
}

// `npm test` loaded the demo into this database during the bootstrap, exactly as `npm start` does.
describe('demo scenario loader', () => {
  afterAll(() => sequelize.close());

  it('was loaded once by the bootstrap, with every demo row present', async () => {
    expect(await AppMeta.findByPk(DEMO_MARKER)).not.toBeNull();
    const [row] = await sequelize.query<{ n: number }>('SELECT COUNT(*) AS n FROM trials WHERE is_demo = 1', { type: QueryTypes.SELECT });
    expect(Number(row.n)).toBe(DEMO_TRIALS.length);
    const [fs] = await sequelize.query<{ n: number }>('SELECT COUNT(*) AS n FROM feedstocks WHERE is_demo = 1', { type: QueryTypes.SELECT });
    expect(Number(fs.n)).toBe(DEMO_FEEDSTOCKS.length);
    const [us] = await sequelize.query<{ n: number }>('SELECT COUNT(*) AS n FROM users WHERE is_demo = 1', { type: QueryTypes.SELECT });
    expect(Number(us.n)).toBe(DEMO_PEOPLE.length);
  });

  it('gave each demo trial its placeholder photos, stored through the storage interface and seen by the evidence', async () => {
    const photos = await Photo.findAll({ order: [['id', 'ASC']] });
    const demo = photos.filter((p) => p.storageKey.startsWith('demo/'));
    expect(demo.length).toBe(DEMO_TRIALS.reduce((n, t) => n + t.photoCount, 0));
    const storage = getStorage();
    for (const p of [demo[0], demo[demo.length - 1]]) {
      expect((await storage.get(p.storageKey))?.contentType).toBe('image/jpeg');
      expect((await storage.get(p.thumbKey))?.contentType).toBe('image/webp');
    }
    // Certainty counts trials with photos: the stored aggregates see them.
    const groups = await EvidenceAggregate.findAll({ attributes: ['result'] });
    const withPhotos = groups.reduce((n, g) => n + (g.result as { counts: { withPhotos: number } }).counts.withPhotos, 0);
    expect(withPhotos).toBeGreaterThan(0);
  });

  it('adds nothing when run again, even twice at once', async () => {
    const before = await counts();
    const [a, b] = await Promise.all([loadDemoScenario(), loadDemoScenario()]);
    expect(a.loaded).toBe(false);
    expect(b.loaded).toBe(false);
    expect(await counts()).toEqual(before);
  });
});
