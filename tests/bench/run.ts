/**
 * `npm run bench`: every benchmark, one after the other. Speed and memory
 * targets live here, not in timed tests. Each part prints its own table and
 * whether its targets hold; the exit code is non-zero when a target is missed.
 */
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';

const parts = ['engine.ts', 'http.ts', 'mail.ts'].map((f) => path.join('tests', 'bench', f)).filter((f) => existsSync(f));
let failed = 0;
for (const part of parts) {
  console.log(`\n=== ${part} ===`);
  const r = spawnSync(process.execPath, ['--conditions=react-server', '--import', 'tsx', '--expose-gc', part], { stdio: 'inherit' });
  if (r.status !== 0) failed += 1;
}
process.exit(failed ? 1 : 0);
