/**
 * `npm test`: everything CI checks, in one command that works on a fresh machine.
 * Installs Debian's PostgreSQL and Chromium when missing (as root), runs the static checks,
 * builds the client, runs every vitest project but the benchmarks, and closes with the plain
 * line `N passed, N failed, N skipped` that CI reads.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { ensurePostgresBinaries } from '../api/dev/postgres';
import { ensureChromium } from './helpers/chromium';

interface Check {
  name: string;
  command: string;
  args: string[];
}

const staticChecks: Check[] = [
  { name: 'typecheck', command: 'npx', args: ['tsc', '--noEmit'] },
  { name: 'lint', command: 'npx', args: ['eslint', '.', '--max-warnings', '0'] },
  { name: 'format', command: 'npx', args: ['prettier', '--check', '.', '--log-level', 'warn'] },
  { name: 'build', command: 'npx', args: ['vite', 'build', '--logLevel', 'warn'] },
  { name: 'build the API bundle', command: 'npx', args: ['tsx', 'api/build.ts'] },
];

function run(command: string, args: string[]): boolean {
  const result = spawnSync(command, args, { stdio: 'inherit', env: process.env });
  return result.status === 0;
}

let passed = 0;
let failed = 0;
let skipped = 0;

ensurePostgresBinaries();
ensureChromium();

for (const check of staticChecks) {
  console.log(`\n▶ ${check.name}`);
  if (run(check.command, check.args)) passed += 1;
  else {
    failed += 1;
    console.log(`✗ ${check.name} failed`);
  }
}

const reportDir = path.resolve('.data/test-report');
const reportFile = path.join(reportDir, 'vitest.json');
rmSync(reportDir, { recursive: true, force: true });
mkdirSync(reportDir, { recursive: true });

console.log('\n▶ vitest (unit, api, e2e)');
const vitestOk = run('npx', [
  'vitest',
  'run',
  '--project',
  'unit',
  '--project',
  'api',
  '--project',
  'e2e',
  '--reporter',
  'default',
  '--reporter',
  'json',
  '--outputFile.json',
  reportFile,
]);

interface VitestReport {
  numPassedTests: number;
  numFailedTests: number;
  numPendingTests: number;
  numTodoTests: number;
  numTotalTestSuites: number;
  numFailedTestSuites: number;
}

try {
  const report = JSON.parse(readFileSync(reportFile, 'utf8')) as VitestReport;
  passed += report.numPassedTests;
  failed += report.numFailedTests;
  skipped += report.numPendingTests + report.numTodoTests;
  // A file that fails to load has no tests to count, but it is still a failure.
  if (!vitestOk && report.numFailedTests === 0) failed += Math.max(1, report.numFailedTestSuites);
} catch {
  console.log('✗ vitest wrote no report');
  failed += 1;
}

console.log(`\n${passed} passed, ${failed} failed, ${skipped} skipped`);
process.exit(failed > 0 ? 1 : 0);
