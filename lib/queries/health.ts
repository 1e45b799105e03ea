import 'server-only';
import { QueryTypes } from 'sequelize';
import { sequelize } from '@/db';

/** Asks MariaDB a trivial question with a short deadline; never throws. */
export async function checkDatabase(timeoutMs = 2_000): Promise<{ ok: boolean; latencyMs: number; error?: string }> {
  const t0 = performance.now();
  try {
    await Promise.race([
      sequelize.query('SELECT 1 AS ok', { type: QueryTypes.SELECT }),
      new Promise((_, reject) => setTimeout(() => reject(new Error('timed out')), timeoutMs)),
    ]);
    return { ok: true, latencyMs: Math.round(performance.now() - t0) };
  } catch {
    return { ok: false, latencyMs: Math.round(performance.now() - t0), error: 'database unreachable' };
  }
}
