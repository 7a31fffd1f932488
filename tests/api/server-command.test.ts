import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { serverBundle, serverNodeFlags } from '../../api/build';
import { projectPath } from '../../api/lib/project-root';

/** Production runs `npm run serve`; the benches and fault tests spawn the bundle with serverNodeFlags. */
describe('the production server command', () => {
  it('runs the built bundle with the same Node flags the benches measure', () => {
    const pkg = JSON.parse(readFileSync(projectPath('package.json'), 'utf8')) as {
      scripts: Record<string, string>;
    };
    const bundle = path.relative(projectPath(), serverBundle);
    expect(pkg.scripts.serve).toBe(['node', ...serverNodeFlags, bundle].join(' '));
  });
});
