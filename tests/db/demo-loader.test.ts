import { afterAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { sequelize } from '@/db';
import { AppMeta } from '@/db/models';
import { DEMO_MARKER, loadDemoScenario } from '@/db/seeders/load-demo';
import { DEMO_FEEDSTOCKS, DEMO_PEOPLE, DEMO_TRIALS } from '@/db/seeders/demo-scenario';

const TABLES = ['users', 'feedstocks', 'feedstock_aliases', 'trials', 'check_ins', 'proposals', 'votes', 'published_verdicts',
  'verdict_history', 'feedstock_requests', 'evidence_aggregates', 'evidence_verdicts'];

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

  it('adds nothing when run again, even twice at once', async () => {
    const before = await counts();
    const [a, b] = await Promise.all([loadDemoScenario(), loadDemoScenario()]);
    expect(a.loaded).toBe(false);
    expect(b.loaded).toBe(false);
    expect(await counts()).toEqual(before);
  });
});
