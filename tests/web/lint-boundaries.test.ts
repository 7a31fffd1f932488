import { mkdirSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { ESLint } from 'eslint';
import { describe, expect, it } from 'vitest';

/*
 * The feature boundaries are kept by lint (eslint.config.js), so these run the project's own ESLint
 * setup on a line of code placed, by its file path, inside one feature.
 */
const eslint = new ESLint();
const inAlerts = 'web/features/alerts/components/boundary-probe.tsx';

async function restrictedImports(code: string, filePath: string) {
  const [result] = await eslint.lintText(code, { filePath });
  return (result?.messages ?? []).filter((message) => message.ruleId === 'import-x/no-restricted-paths');
}

describe('web feature boundaries', () => {
  it('refuses an import from another feature', async () => {
    const problems = await restrictedImports(
      "import { StaffList } from '../../people/components/staff-list';\nexport const probe = StaffList;\n",
      inAlerts,
    );
    expect(problems).toHaveLength(1);
    expect(problems[0]?.severity).toBe(2);
    expect(problems[0]?.message).toContain('A feature never imports another feature');
  });

  it('refuses an import from web/app in a feature', async () => {
    const problems = await restrictedImports(
      "import { RootLayout } from '../../../app/root-layout';\nexport const probe = RootLayout;\n",
      inAlerts,
    );
    expect(problems).toHaveLength(1);
    expect(problems[0]?.severity).toBe(2);
  });

  it('refuses an import from a feature in web/components', async () => {
    const problems = await restrictedImports(
      "import { AlertCard } from '../features/alerts/components/alert-card';\nexport const probe = AlertCard;\n",
      'web/components/boundary-probe.tsx',
    );
    expect(problems).toHaveLength(1);
  });

  it('allows web/lib, web/components and the feature’s own files', async () => {
    const problems = await restrictedImports(
      [
        "import { formatDateTime } from '../../../lib/format';",
        "import { SeverityBadge } from '../../../components/alert-badges';",
        "import { AlertCard } from './alert-card';",
        'export const probe = [formatDateTime, SeverityBadge, AlertCard];',
        '',
      ].join('\n'),
      inAlerts,
    );
    expect(problems).toEqual([]);
  });

  it('lets web/app compose features', async () => {
    const problems = await restrictedImports(
      "import { AlertsBoard } from '../../features/alerts/components/alerts-board';\nexport const probe = AlertsBoard;\n",
      'web/app/routes/boundary-probe.tsx',
    );
    expect(problems).toEqual([]);
  });
});

describe('import cycles', () => {
  it('refuses two modules that import each other', async () => {
    // Cycles need real files on both sides, so two are written for the length of the test.
    const folder = path.resolve('tests/cycle-probe');
    mkdirSync(folder, { recursive: true });
    try {
      writeFileSync(path.join(folder, 'a.ts'), "import { b } from './b';\nexport const a = () => b;\n");
      writeFileSync(path.join(folder, 'b.ts'), "import { a } from './a';\nexport const b = () => a;\n");
      const [result] = await eslint.lintFiles([path.join(folder, 'a.ts')]);
      const cycles = (result?.messages ?? []).filter((message) => message.ruleId === 'import-x/no-cycle');
      expect(cycles).toHaveLength(1);
      expect(cycles[0]?.severity).toBe(2);
    } finally {
      rmSync(folder, { recursive: true, force: true });
    }
  });
});
