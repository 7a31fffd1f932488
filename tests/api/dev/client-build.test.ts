import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { hashClientInputs, listProjectFiles, projectRoot } from '../../../api/dev/client-build';

let root: string;

function write(file: string, content: string) {
  mkdirSync(path.dirname(path.join(root, file)), { recursive: true });
  writeFileSync(path.join(root, file), content);
}

beforeEach(() => {
  root = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-client-hash-'));
  write('.gitignore', 'node_modules/\ndist/\n.data/\n*.log\n');
  write('index.html', '<div id="root"></div>');
  write('vite.config.ts', 'export default {};');
  write('web/main.tsx', 'export const App = () => <p className="text-sm">Tanks</p>;');
  write('shared/alerts/rules.ts', 'export const rule = 1;');
  write('api/routes/tanks.ts', 'export const routes = [];');
});

afterEach(() => rmSync(root, { recursive: true, force: true }));

describe('hashClientInputs', () => {
  it('stays the same while nothing changes', async () => {
    expect(await hashClientInputs(root, {})).toBe(await hashClientInputs(root, {}));
  });

  it('changes when a file in web/ changes, and comes back with its content', async () => {
    const before = await hashClientInputs(root, {});
    write('web/main.tsx', 'export const App = () => <p className="text-lg">Tanks</p>;');
    const edited = await hashClientInputs(root, {});
    write('web/main.tsx', 'export const App = () => <p className="text-sm">Tanks</p>;');

    expect(edited).not.toBe(before);
    expect(await hashClientInputs(root, {})).toBe(before);
  });

  it('changes when a file is added anywhere Tailwind looks for class names', async () => {
    const before = await hashClientInputs(root, {});
    write('api/services/mail.ts', 'export const banner = "bg-brine-600";');
    expect(await hashClientInputs(root, {})).not.toBe(before);
  });

  it('leaves out the build output, node_modules and what .gitignore excludes', async () => {
    const before = await hashClientInputs(root, {});
    write('dist/web/index.html', '<p>built</p>');
    write('node_modules/some-package/index.js', 'module.exports = 1;');
    write('.data/postgres/data/PG_VERSION', '15');
    write('start.log', 'listening');
    write('.git/HEAD', 'ref: refs/heads/main');
    expect(await hashClientInputs(root, {})).toBe(before);
  });

  it('counts the VITE_ variables Vite puts into the client, and no others', async () => {
    const before = await hashClientInputs(root, {});
    expect(await hashClientInputs(root, { PORT: '3999' })).toBe(before);
    expect(await hashClientInputs(root, { VITE_SUPPORT_PHONE: '0100' })).not.toBe(before);
  });
});

describe('listProjectFiles', () => {
  it('lists what Vite reads in this project', async () => {
    const files = await listProjectFiles(projectRoot);
    expect(files).toEqual(
      expect.arrayContaining([
        'index.html',
        'vite.config.ts',
        'tsconfig.json',
        'package.json',
        'package-lock.json',
        'web/main.tsx',
        'web/styles.css',
      ]),
    );
    expect(files.some((file) => file.startsWith('shared/'))).toBe(true);
    expect(files.some((file) => /^(node_modules|dist|\.git|\.data)\//.test(file))).toBe(false);
  });
});
