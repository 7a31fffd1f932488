import type pg from 'pg';
import type { Health } from '@shared/schemas/health';

const probeTimeoutMs = 2000;

export async function getHealth(pool: pg.Pool): Promise<Health> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new Error('database probe timed out')), probeTimeoutMs);
  });
  try {
    await Promise.race([pool.query('select 1'), timeout]);
    return { status: 'ok', db: 'ok' };
  } catch {
    return { status: 'degraded', db: 'down' };
  } finally {
    clearTimeout(timer);
  }
}
