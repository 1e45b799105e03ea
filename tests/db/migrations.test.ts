import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { createMigrator } from '@/db/migrator';
import { MIGRATIONS } from '@/db/migrations';
import { createScratchDatabase } from '../support/db';

// Every migration up, down to nothing, and up again, on a scratch database of the real MariaDB.
describe('migrations', () => {
  let scratch: Awaited<ReturnType<typeof createScratchDatabase>>;
  beforeAll(async () => {
    scratch = await createScratchDatabase('migr');
  });
  afterAll(async () => {
    await scratch?.drop();
  });

  const tables = async () =>
    (
      await scratch.sequelize.query<{ t: string }>(
        'SELECT table_name AS t FROM information_schema.tables WHERE table_schema = DATABASE() ORDER BY table_name',
        { type: QueryTypes.SELECT },
      )
    ).map((r) => r.t);

  it('go up, all the way down, and up again', async () => {
    const migrator = createMigrator(scratch.sequelize);
    const up1 = await migrator.up();
    expect(up1.map((m) => m.name)).toEqual(MIGRATIONS.map((m) => m.name));
    const after1 = await tables();
    for (const t of ['users', 'accounts', 'sessions', 'verification_tokens', 'feedstocks', 'feedstock_aliases', 'feedstock_revisions',
      'feedstock_requests', 'trials', 'check_ins', 'photos', 'evidence_aggregates', 'evidence_verdicts', 'proposals', 'proposal_trials',
      'votes', 'published_verdicts', 'verdict_history', 'subscriptions', 'outbox', 'audit_log', 'app_meta']) {
      expect(after1).toContain(t);
    }
    const down = await migrator.down({ to: 0 });
    expect(down).toHaveLength(MIGRATIONS.length);
    expect(await tables()).toEqual(['schema_migrations']);
    const up2 = await migrator.up();
    expect(up2).toHaveLength(MIGRATIONS.length);
    expect(await tables()).toEqual(after1);
    expect(await migrator.pending()).toEqual([]);
  });
});
