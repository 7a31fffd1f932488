import path from 'node:path';
import type { Env } from '../env';
import { startPostgres } from './postgres';

export interface LocalDatabase {
  url: string;
  stop(): Promise<void>;
}

/** DATABASE_URL when set; otherwise the demo's own persistent cluster under DATA_DIR. */
export async function openLocalDatabase(
  env: Env,
  log: (line: string) => void = console.log,
): Promise<LocalDatabase> {
  if (env.DATABASE_URL) return { url: env.DATABASE_URL, stop: async () => {} };
  const running = await startPostgres({
    dir: path.join(env.DATA_DIR, 'postgres'),
    port: env.PGPORT_LOCAL,
    database: 'brinewatch',
    durable: true,
    log,
  });
  log(`PostgreSQL listening on 127.0.0.1:${env.PGPORT_LOCAL} (data in ${env.DATA_DIR}/postgres)`);
  return running;
}
