import { fileURLToPath } from 'node:url';
import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vitest/config';

const sharedDir = fileURLToPath(new URL('./shared', import.meta.url));
const apiPort = Number(process.env.PORT ?? 3000);

export default defineConfig({
  root: '.',
  publicDir: 'web/public',
  plugins: [react(), tailwindcss()],
  resolve: { alias: { '@shared': sharedDir } },
  build: { outDir: 'dist/web', emptyOutDir: true, sourcemap: true },
  server: {
    port: 5173,
    proxy: {
      '/api': `http://localhost:${apiPort}`,
      '/auth': `http://localhost:${apiPort}`,
    },
  },
  test: {
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          include: ['tests/shared/**/*.test.ts', 'tests/web/**/*.test.{ts,tsx}'],
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
