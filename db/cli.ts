/**
 * Database commands, run by `npm start` / `npm test` and by hand:
 *   migrate | migrate-down-all | seed-demo | recompute | queue-reminders | digest
 * Run with `node --conditions=react-server --import tsx db/cli.ts <command>`
 * (the npm scripts `db:migrate`, `db:seed`, `recompute` do this).
 */
import { sequelize } from './index';
import { createMigrator } from './migrator';

async function main(command: string | undefined) {
  switch (command) {
    case 'migrate': {
      const done = await createMigrator(sequelize).up();
      console.log(done.length ? `applied ${done.length} migration(s): ${done.map((m) => m.name).join(', ')}` : 'schema up to date');
      break;
    }
    case 'migrate-down-all': {
      const done = await createMigrator(sequelize).down({ to: 0 });
      console.log(`reverted ${done.length} migration(s)`);
      break;
    }
    case 'seed-demo': {
      const { loadDemoScenario } = await import('./seeders/load-demo');
      const r = await loadDemoScenario();
      console.log(r.loaded ? `demo scenario loaded: ${JSON.stringify(r.counts)}` : 'demo scenario already loaded; nothing added');
      break;
    }
    case 'recompute': {
      const { recomputeAll } = await import('@/lib/services/evidence');
      const report = await recomputeAll();
      console.log(`recomputed ${report.feedstocks} feedstock(s); ${report.changes.length} evidence verdict(s) changed`);
      for (const c of report.changes) console.log(`  ${c.slug} (${c.setting}): ${c.from ?? 'none'} → ${c.to}`);
      break;
    }
    case 'queue-reminders': {
      // A job: run it daily (cron, systemd timer); each due check-in is queued once.
      const { queueDueCheckInReminders } = await import('@/lib/services/reminders');
      const r = await queueDueCheckInReminders(new Date());
      console.log(`${r.due} trial(s) with a check-in due; ${r.queued} reminder(s) queued in the outbox`);
      break;
    }
    case 'digest': {
      // The weekly digest now, whatever the schedule; the outbox worker sends the mails it queues.
      const { runWeeklyDigest } = await import('@/lib/services/digests');
      const r = await runWeeklyDigest(new Date());
      console.log(`weekly digest: ${r.digests} mail(s) queued covering ${r.items} update(s)${r.cancelled ? `; ${r.cancelled} cancelled (unsubscribed)` : ''}`);
      break;
    }
    default:
      console.error('usage: db/cli.ts migrate|migrate-down-all|seed-demo|recompute|queue-reminders|digest');
      process.exitCode = 2;
  }
}

main(process.argv[2])
  .catch((err) => {
    console.error(err instanceof Error ? err.stack ?? err.message : err);
    process.exitCode = 1;
  })
  .finally(() => sequelize.close());
