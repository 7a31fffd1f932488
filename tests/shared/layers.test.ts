import { ESLint } from 'eslint';
import { describe, expect, it } from 'vitest';

/*
 * The layers of shared/ are kept by lint (eslint.config.js), so these run the project's own ESLint
 * setup on a line of code placed, by its file path, in a shared/ folder.
 */
const eslint = new ESLint();

async function restrictedImports(code: string, filePath: string) {
  const [result] = await eslint.lintText(code, { filePath });
  return (result?.messages ?? []).filter((message) => message.ruleId === 'import-x/no-restricted-paths');
}

describe('shared/ layers', () => {
  it.each(['alerts', 'chemistry', 'livestock', 'parameters', 'people', 'photos', 'readings', 'text'])(
    'refuses an import of the request schemas in shared/%s',
    async (folder) => {
      const problems = await restrictedImports(
        "import { updateLimitsInput } from '@shared/schemas/limits';\nexport const probe = updateLimitsInput;\n",
        `shared/${folder}/layer-probe.ts`,
      );
      expect(problems).toHaveLength(1);
      expect(problems[0]?.severity).toBe(2);
      expect(problems[0]?.message).toContain('shared/ is layered');
    },
  );

  it('lets the request schemas build on the domain layer', async () => {
    const problems = await restrictedImports(
      [
        "import { parameterLimits } from '@shared/parameters/limits';",
        "import { readingSource } from '@shared/readings/sources';",
        "import { updateLimitsInput } from './limits';",
        'export const probe = [parameterLimits, readingSource, updateLimitsInput];',
        '',
      ].join('\n'),
      'shared/schemas/layer-probe.ts',
    );
    expect(problems).toEqual([]);
  });
});
