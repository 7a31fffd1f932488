import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { firstLoadFor } from '@shared/first-load/routes';
import { escapeHtml } from './html';

interface ManifestChunk {
  file: string;
  isEntry?: boolean;
  imports?: string[];
}

/**
 * The build's files a route's lazy module needs before it runs (its chunk and the chunks it imports),
 * less those the entry already loads, by the module's source path. Empty without a manifest.
 */
function routeModuleFiles(webDist: string): Map<string, string[]> {
  const manifestPath = path.join(webDist, '.vite', 'manifest.json');
  const files = new Map<string, string[]>();
  if (!existsSync(manifestPath)) return files;
  const manifest = JSON.parse(readFileSync(manifestPath, 'utf8')) as Record<string, ManifestChunk>;
  const closure = (key: string, seen = new Set<string>()): Set<string> => {
    if (seen.has(key) || !manifest[key]) return seen;
    seen.add(key);
    for (const imported of manifest[key].imports ?? []) closure(imported, seen);
    return seen;
  };
  const loadedByEntry = new Set<string>();
  for (const [key, chunk] of Object.entries(manifest)) {
    if (chunk.isEntry) for (const loaded of closure(key)) loadedByEntry.add(loaded);
  }
  for (const key of Object.keys(manifest)) {
    if (!key.startsWith('web/app/routes/')) continue;
    const needed = [...closure(key)].filter((chunk) => !loadedByEntry.has(chunk));
    files.set(
      key,
      needed.map((chunk) => `/${manifest[chunk]!.file}`),
    );
  }
  return files;
}

/**
 * The app shell for one address: index.html with preloads for the API reads and the lazy module
 * the page's first screen needs (shared/first-load/routes.ts), so they start with the HTML rather
 * than after the bundle has run. Links only, no inline script, so the CSP stays as strict. Each
 * inserted link carries `data-first-load`: the service worker keeps the shell without them, since
 * its copy is opened at any address.
 */
export function createClientShell(webDist: string) {
  const html = readFileSync(path.join(webDist, 'index.html'), 'utf8');
  const moduleFiles = routeModuleFiles(webDist);
  const insertAt = html.indexOf('</head>');
  return (pathname: string, search: string, { signedIn }: { signedIn: boolean }): string => {
    if (insertAt < 0) return html;
    const { reads, module } = firstLoadFor(pathname, search, { signedIn });
    const links = [
      // crossorigin (anonymous) is fetch()'s own credentials mode for the same origin: only then
      // does the browser hand the preloaded answer to the app's fetch instead of asking again.
      ...reads.map(
        (href) => `<link rel="preload" as="fetch" crossorigin href="${escapeHtml(href)}" data-first-load>`,
      ),
      ...(module ? (moduleFiles.get(module) ?? []) : []).map(
        (href) => `<link rel="modulepreload" crossorigin href="${escapeHtml(href)}" data-first-load>`,
      ),
    ];
    return `${html.slice(0, insertAt)}${links.map((link) => `  ${link}\n`).join('')}${html.slice(insertAt)}`;
  };
}
