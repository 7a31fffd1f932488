import { build } from 'esbuild';
import { isMain } from './lib/is-main';
import { projectPath } from './lib/project-root';

/** Where `npm run build` puts the API for production: run it with `node dist/api/server.mjs`. */
export const serverBundle = projectPath('dist', 'api', 'server.mjs');

/**
 * The API as one ES module, compiled ahead: no TypeScript compiler in the running process (tsx
 * keeps about 75 MiB of compiled sources and its loader alive, tests/bench `start` and `overview`
 * measure it). The packages stay in node_modules, as installed; only our own code is bundled. No
 * minifying, so stack traces keep our function names; the bundle is two folders below the project
 * like api/lib/project-root.ts, so the paths it derives hold in both.
 */
export async function buildServer(outfile = serverBundle): Promise<string> {
  await build({
    entryPoints: [projectPath('api', 'server.ts')],
    outfile,
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    packages: 'external',
    tsconfig: projectPath('tsconfig.json'),
    logLevel: 'warning',
    legalComments: 'none',
  });
  return outfile;
}

if (isMain(import.meta.url)) await buildServer();
