import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';

/*
 * What an owner's browser downloads before their tank page can draw: the entry (index.html's
 * script, its static imports and CSS) and the tank route's chunk with its static imports and CSS.
 * Read from the build's manifest; sizes are gzip level 9 of each file (deterministic, unlike a
 * server's on-the-fly compression), summed.
 */
const root = path.resolve(import.meta.dirname, '../..');
const dist = path.join(root, 'dist/web');
const manifestFile = path.join(dist, '.vite/manifest.json');
const budgetBytes = 180_000;
const firstLoadKeys = ['index.html', 'web/app/routes/tank.tsx'];
const chartKey = 'web/features/readings/components/readings-chart.tsx';
const chartLibrary = /node_modules\/(chart\.js|react-chartjs-2|chartjs-adapter-date-fns)\//;

interface ManifestChunk {
  file: string;
  imports?: string[];
  dynamicImports?: string[];
  css?: string[];
}
type Manifest = Record<string, ManifestChunk>;

function newestSourceChange(): number {
  let newest = 0;
  const visit = (dir: string) => {
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) visit(full);
      else newest = Math.max(newest, statSync(full).mtimeMs);
    }
  };
  visit(path.join(root, 'web'));
  visit(path.join(root, 'shared'));
  newest = Math.max(newest, statSync(path.join(root, 'index.html')).mtimeMs);
  return newest;
}

function readManifest(): Manifest {
  if (!existsSync(manifestFile)) {
    throw new Error(`${path.relative(root, manifestFile)} is missing: run \`npx vite build\` first.`);
  }
  if (statSync(manifestFile).mtimeMs < newestSourceChange()) {
    throw new Error('The build in dist/web is older than web/ or shared/: run `npx vite build` first.');
  }
  return JSON.parse(readFileSync(manifestFile, 'utf8')) as Manifest;
}

/** Every chunk key reached from `keys` through static imports only. */
function staticClosure(manifest: Manifest, keys: string[]): Set<string> {
  const seen = new Set<string>();
  const stack = [...keys];
  while (stack.length > 0) {
    const key = stack.pop()!;
    if (seen.has(key)) continue;
    const chunk = manifest[key];
    if (!chunk) throw new Error(`The manifest has no chunk ${key}`);
    seen.add(key);
    stack.push(...(chunk.imports ?? []));
  }
  return seen;
}

function firstLoadFiles(manifest: Manifest): string[] {
  const files = new Set<string>();
  for (const key of staticClosure(manifest, firstLoadKeys)) {
    const chunk = manifest[key]!;
    files.add(chunk.file);
    for (const css of chunk.css ?? []) files.add(css);
  }
  return [...files];
}

describe("the owner's tank page, first load", () => {
  it(`downloads at most ${budgetBytes.toLocaleString('en')} bytes of JavaScript and CSS (gzip -9)`, () => {
    const manifest = readManifest();
    const sizes = firstLoadFiles(manifest)
      .map((file) => ({ file, gzip: gzipSync(readFileSync(path.join(dist, file)), { level: 9 }).length }))
      .sort((a, b) => b.gzip - a.gzip);
    const total = sizes.reduce((sum, { gzip }) => sum + gzip, 0);

    // The largest files are named so a failure says where the bytes went.
    const largest = sizes.slice(0, 5).map(({ file, gzip }) => `${file} ${gzip}`);
    expect(total, `first load ${total} bytes; largest: ${largest.join(', ')}`).toBeLessThanOrEqual(
      budgetBytes,
    );
  });

  it('loads the chart library only when a chart is shown', () => {
    const manifest = readManifest();
    const firstLoad = staticClosure(manifest, firstLoadKeys);

    expect(manifest[chartKey], 'the readings chart is a chunk of its own').toBeDefined();
    expect(firstLoad.has(chartKey)).toBe(false);
    const dynamicImporters = Object.keys(manifest).filter((key) =>
      manifest[key]!.dynamicImports?.includes(chartKey),
    );
    expect(dynamicImporters.length).toBeGreaterThan(0);
    // No first-load file holds the library's code under another chunk's name either.
    for (const file of firstLoadFiles(manifest).filter((name) => name.endsWith('.js'))) {
      // The bundler's own runtime comes from no source file and has no map.
      if (!readFileSync(path.join(dist, file), 'utf8').includes('sourceMappingURL=')) continue;
      const map = JSON.parse(readFileSync(path.join(dist, `${file}.map`), 'utf8')) as { sources: string[] };
      expect(
        map.sources.filter((source) => chartLibrary.test(source)),
        file,
      ).toEqual([]);
    }
  });
});
