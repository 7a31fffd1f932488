import { build } from 'esbuild';
import { isMain } from './lib/is-main';
import { projectPath } from './lib/project-root';

/** Where `npm run build` puts the API for production: run it with `npm run serve`. */
export const serverBundle = projectPath('dist', 'api', 'server.mjs');

/**
 * Node's flags for the API in production (`npm run serve` passes the same; a test holds them
 * equal). A ceiling on V8's old generation: the API keeps about 50 MB alive, but on a machine with
 * plenty of memory V8 let garbage grow to 220 MB before its first full collection, so the process
 * peaked at 320–335 MiB under the staff overview's load; with a 256 MB ceiling it collects sooner
 * and peaked at 189 MiB, at the same p50 (bench overview, 2026-12-03). Five times what is live
 * leaves room for the heaviest request (a 10 MB photo upload).
 */
export const serverNodeFlags = ['--max-old-space-size=256'] as const;

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
