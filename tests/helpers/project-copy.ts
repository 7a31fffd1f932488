import { cpSync, mkdirSync, symlinkSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { hashClientInputs, listProjectFiles, projectRoot } from '../../api/dev/client-build';

/**
 * The project's own files copied to `target`, sharing node_modules, for tests that run the launcher
 * as `npm start` does: its client build stays out of the dist/web that other runs serve, and edits
 * made in the working tree meanwhile do not reach it.
 */
export async function copyProject(target: string): Promise<void> {
  for (const file of await listProjectFiles(projectRoot)) {
    mkdirSync(path.dirname(path.join(target, file)), { recursive: true });
    cpSync(path.join(projectRoot, file), path.join(target, file));
  }
  symlinkSync(path.join(projectRoot, 'node_modules'), path.join(target, 'node_modules'));
}

/**
 * Records a client build of the copy as it stands, for a test about something else than the build:
 * the launcher then finds the client up to date and serves this placeholder page.
 */
export async function markClientBuilt(project: string): Promise<void> {
  const outDir = path.join(project, 'dist', 'web');
  mkdirSync(outDir, { recursive: true });
  writeFileSync(path.join(outDir, 'index.html'), '<!doctype html><title>Brinewatch</title>\n');
  writeFileSync(path.join(outDir, '.build-hash'), `${await hashClientInputs(project)}\n`);
}
