import { readdir, readFile, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { brotliCompress, constants, gzip } from 'node:zlib';
import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import type { Plugin } from 'vite';
import { defineConfig } from 'vitest/config';

const sharedDir = fileURLToPath(new URL('./shared', import.meta.url));
const apiPort = Number(process.env.PORT ?? 3000);

const compressible = /\.(js|mjs|css|html|svg|json|webmanifest|txt)$/;
const brotli = promisify(brotliCompress);
const gzipAsync = promisify(gzip);

/**
 * Writes a .br and a .gz beside each built file of 1 kB or more, which api/app.ts serves as they
 * are instead of compressing assets on every request. Source maps and the build manifest are left
 * alone. Written here rather than taken from vite-plugin-compression2, whose factory replaces
 * process.stdout.write whenever this config is loaded (also by vitest) to hold back Vite's
 * "built in" line.
 */
function precompress(): Plugin {
  let outDir = '';
  return {
    name: 'brinewatch:precompress',
    apply: 'build',
    configResolved(config) {
      outDir = path.resolve(config.root, config.build.outDir);
    },
    async closeBundle() {
      const entries = await readdir(outDir, { recursive: true, withFileTypes: true }).catch(() => []);
      const files = entries
        .filter((entry) => entry.isFile() && compressible.test(entry.name))
        .map((entry) => path.join(entry.parentPath, entry.name))
        .filter((file) => !path.relative(outDir, file).startsWith(`.vite${path.sep}`));
      await Promise.all(
        files.map(async (file) => {
          const source = await readFile(file);
          if (source.length < 1024) return;
          const [br, gz] = await Promise.all([
            brotli(source, {
              params: {
                [constants.BROTLI_PARAM_QUALITY]: constants.BROTLI_MAX_QUALITY,
                [constants.BROTLI_PARAM_SIZE_HINT]: source.length,
              },
            }),
            gzipAsync(source, { level: constants.Z_BEST_COMPRESSION }),
          ]);
          // A file that does not shrink is served as it is.
          if (br.length < source.length) await writeFile(`${file}.br`, br);
          if (gz.length < source.length) await writeFile(`${file}.gz`, gz);
        }),
      );
    },
  };
}

export default defineConfig({
  root: '.',
  publicDir: 'web/public',
  plugins: [react(), tailwindcss(), precompress()],
  resolve: { alias: { '@shared': sharedDir } },
  // The manifest lists each chunk's static and dynamic imports (tests/web/bundle-budget.test.ts).
  build: { outDir: 'dist/web', emptyOutDir: true, sourcemap: true, manifest: true },
  server: {
    port: 5173,
    proxy: {
      '/api': `http://localhost:${apiPort}`,
      '/auth': `http://localhost:${apiPort}`,
    },
  },
  test: {
    // Vitest's default on a 2-core machine is one worker (cores − 1). Most API test files wait on
    // PostgreSQL, child processes and timers rather than the CPU, so two files at a time finish the
    // run sooner; the browser tests stay one file at a time (their project sets fileParallelism).
    maxWorkers: 2,
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          include: [
            'tests/shared/**/*.test.ts',
            'tests/web/**/*.test.{ts,tsx}',
            // The benches' pure helpers (figures, tables, plan summaries); the benches never run here.
            'tests/bench/support/**/*.test.ts',
          ],
          // The lint tests load ESLint with the import resolver: seconds on a quiet machine, more on CI.
          testTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          globalSetup: ['tests/helpers/global-db.ts'],
          // Upper bounds for a hang, sized for a loaded 2-core CI machine, never a speed target.
          testTimeout: 120_000,
          hookTimeout: 180_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          globalSetup: ['tests/helpers/global-e2e.ts'],
          testTimeout: 180_000,
          hookTimeout: 300_000,
          fileParallelism: false,
        },
      },
      {
        extends: true,
        test: { name: 'bench', include: [], benchmark: { include: ['tests/bench/**/*.bench.ts'] } },
      },
    ],
  },
});
