import path from 'node:path';
import { fileURLToPath } from 'node:url';

/**
 * The project's folder. This file sits two levels below it in the source (api/lib/) and so does the
 * production bundle it is compiled into (dist/api/server.mjs, `npm run build`), so the same
 * relative step finds it from both.
 */
export const projectRoot = fileURLToPath(new URL('../../', import.meta.url));

export function projectPath(...parts: string[]): string {
  return path.join(projectRoot, ...parts);
}
