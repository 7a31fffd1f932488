import { spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync } from 'node:fs';
import { link, mkdir, readdir, readFile, rm, stat, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

/**
 * `npm start` builds the client only when its inputs changed since the last build, which it
 * records in `dist/web/.build-hash` once the build has succeeded.
 */

export const projectRoot = fileURLToPath(new URL('../..', import.meta.url));

const hashFileName = '.build-hash';
const buildArgs = ['build', '--logLevel', 'warn'];

export type ClientBuildResult = 'up-to-date' | 'built';

export interface ClientBuildOptions {
  root?: string;
  log?: (line: string) => void;
}

export async function ensureClientBuild(options: ClientBuildOptions = {}): Promise<ClientBuildResult> {
  const root = options.root ?? projectRoot;
  const log = options.log ?? console.log;
  const outDir = path.join(root, 'dist', 'web');
  const hashFile = path.join(outDir, hashFileName);
  const isCurrent = async (hash: string) =>
    existsSync(path.join(outDir, 'index.html')) &&
    (await readFile(hashFile, 'utf8').catch(() => '')).trim() === hash;

  if (await isCurrent(await hashClientInputs(root))) return 'up-to-date';
  return withBuildLock(path.join(root, 'dist'), log, async () => {
    // Hashed again under the lock: another start may have built while this one waited.
    const hash = await hashClientInputs(root);
    if (await isCurrent(hash)) return 'up-to-date';
    log('Building the client (its sources changed since the last build)…');
    await rm(hashFile, { force: true });
    await runViteBuild(root);
    // Written last, so a failed or interrupted build is tried again by the next start.
    await writeFile(hashFile, `${hash}\n`);
    return 'built';
  });
}

/**
 * sha256 over every file that can change the built client. Vite reads index.html, web/, shared/,
 * its config, tsconfig.json, the installed packages (package-lock.json), `.env*` files and VITE_*
 * variables; but Tailwind v4, with no `source()` in web/styles.css, scans every file under Vite's
 * root that .gitignore leaves in for class names (@tailwindcss/vite 4.3, its scanner setup), so an
 * edit in api/ or tests/ can change the CSS too. All of them count: a change that did not matter costs a
 * needless build, a missed input would serve a stale client.
 */
export async function hashClientInputs(root: string, env: NodeJS.ProcessEnv = process.env): Promise<string> {
  const files = await listProjectFiles(root);
  const hash = createHash('sha256');
  const viteEnv = Object.entries(env)
    .filter(([name]) => name.startsWith('VITE_'))
    .sort(([a], [b]) => a.localeCompare(b));
  hash.update(JSON.stringify({ buildArgs, viteEnv }));
  // Read in slices: the whole project at once could exhaust file descriptors.
  for (let start = 0; start < files.length; start += 64) {
    const slice = files.slice(start, start + 64);
    // A file removed since the listing (someone's temporary file) counts as changed, not as an error.
    const contents = await Promise.all(
      slice.map((file) => readFile(path.join(root, file)).catch(() => null)),
    );
    slice.forEach((file, index) => {
      const content = contents[index] ?? null;
      hash.update(`\0${file}\0${content === null ? 'gone' : content.length}\0`);
      if (content) hash.update(content);
    });
  }
  return hash.digest('hex');
}

/** Project files, relative with `/`, sorted; without .git, node_modules, the build output and what .gitignore excludes. */
export async function listProjectFiles(root: string): Promise<string[]> {
  const ignored = await readIgnoreRules(root);
  const files: string[] = [];
  const walk = async (dir: string) => {
    // A folder removed while walking (someone's temporary one) has nothing left to hash.
    const entries = await readdir(path.join(root, dir), { withFileTypes: true }).catch(() => []);
    for (const entry of entries) {
      const relative = dir ? `${dir}/${entry.name}` : entry.name;
      const isDirectory =
        entry.isDirectory() ||
        (entry.isSymbolicLink() && (await stat(path.join(root, relative)).catch(() => null))?.isDirectory());
      if (ignored(relative, isDirectory === true)) continue;
      if (isDirectory) await walk(relative);
      else if (entry.isFile() || entry.isSymbolicLink()) files.push(relative);
    }
  };
  await walk('');
  // Vite loads these whatever .gitignore says of them.
  const envFiles = (await readdir(root)).filter(
    (name) => /^\.env(\..+)?$/.test(name) && !files.includes(name),
  );
  return [...files, ...envFiles].sort();
}

const alwaysIgnored = ['.git', 'node_modules', '/dist/'];

/**
 * The common forms of .gitignore lines (`name`, `dir/`, `/anchored`, `*.log`, `a/b/`). A form this
 * does not read (negations) ignores nothing, which can only add files to the hash.
 */
async function readIgnoreRules(root: string): Promise<(relative: string, isDirectory: boolean) => boolean> {
  const text = await readFile(path.join(root, '.gitignore'), 'utf8').catch(() => '');
  const rules = [...alwaysIgnored, ...text.split('\n')]
    .map((line) => line.trim())
    .filter((line) => line && !line.startsWith('#') && !line.startsWith('!'))
    .map((line) => {
      const directoryOnly = line.endsWith('/');
      const pattern = line.replace(/\/+$/, '');
      const anchored = pattern.includes('/');
      return { directoryOnly, anchored, regex: globToRegex(pattern.replace(/^\//, '')) };
    });
  return (relative, isDirectory) =>
    rules.some(
      (rule) =>
        (isDirectory || !rule.directoryOnly) &&
        rule.regex.test(rule.anchored ? relative : relative.slice(relative.lastIndexOf('/') + 1)),
    );
}

function globToRegex(glob: string): RegExp {
  const source = glob
    .split(/(\*\*|\*|\?)/)
    .map((part) =>
      part === '**'
        ? '.*'
        : part === '*'
          ? '[^/]*'
          : part === '?'
            ? '[^/]'
            : part.replace(/[.+^${}()|[\]\\]/g, '\\$&'),
    )
    .join('');
  return new RegExp(`^${source}$`);
}

function runViteBuild(root: string): Promise<void> {
  // NODE_ENV is the app's (tests start it with `test`); Vite must build for production either way.
  const { NODE_ENV: _appMode, ...env } = process.env;
  const child = spawn(
    process.execPath,
    [path.join(root, 'node_modules', 'vite', 'bin', 'vite.js'), ...buildArgs],
    {
      cwd: root,
      env,
      stdio: 'inherit',
    },
  );
  // A start stopped mid-build must not leave the build writing into dist/web behind it.
  const stopBuild = () => child.kill();
  process.once('exit', stopBuild);
  return new Promise<void>((resolve, reject) => {
    child.once('error', reject);
    child.once('exit', (code, signal) => {
      process.off('exit', stopBuild);
      if (code === 0) resolve();
      else reject(new Error(`vite build failed (${signal ?? `exit code ${code}`})`));
    });
  });
}

/**
 * Two starts at once (two test files, or a start beside a test) would both empty and write
 * dist/web. The lock is a file holding its owner's pid, made complete and then linked into place,
 * so nobody ever reads it half written; one whose owner is gone is stale.
 */
async function withBuildLock<T>(
  dir: string,
  log: (line: string) => void,
  work: () => Promise<T>,
): Promise<T> {
  await mkdir(dir, { recursive: true });
  const lock = path.join(dir, '.client-build.lock');
  const mine = `${lock}.${process.pid}`;
  await writeFile(mine, String(process.pid));
  let told = false;
  try {
    for (;;) {
      try {
        await link(mine, lock);
        break;
      } catch (error) {
        if ((error as NodeJS.ErrnoException).code !== 'EEXIST') throw error;
      }
      const owner = await readFile(lock, 'utf8').then(Number, () => null);
      // Gone in between: its owner finished, so try again.
      if (owner === null) continue;
      if (!isAlive(owner)) {
        await rm(lock, { force: true });
        continue;
      }
      if (!told) log(`Waiting for the client build of another start (pid ${owner})…`);
      told = true;
      await new Promise((resolve) => setTimeout(resolve, 500));
    }
  } finally {
    await rm(mine, { force: true });
  }
  try {
    return await work();
  } finally {
    await rm(lock, { force: true });
  }
}

function isAlive(pid: number): boolean {
  if (!Number.isInteger(pid) || pid <= 0) return false;
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}
