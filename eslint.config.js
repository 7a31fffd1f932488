import { readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import js from '@eslint/js';
import drizzle from 'eslint-plugin-drizzle';
import importX from 'eslint-plugin-import-x';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import jsxA11y from 'eslint-plugin-jsx-a11y';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

const root = fileURLToPath(new URL('.', import.meta.url));

// One zone per feature folder: a feature imports web/lib, web/components, shared/ and itself only.
const features = readdirSync(new URL('./web/features', import.meta.url), { withFileTypes: true })
  .filter((entry) => entry.isDirectory())
  .map((entry) => entry.name);
const featureZones = features.map((feature) => ({
  target: `./web/features/${feature}`,
  from: './web/features',
  except: [`./${feature}`],
  message:
    'A feature never imports another feature: move the shared piece down to web/lib or web/components.',
}));

export default tseslint.config(
  { ignores: ['dist/**', '.data/**', 'drizzle/**', 'node_modules/**', 'tests/artifacts/**', 'coverage/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    plugins: { 'import-x': importX },
    settings: {
      'import-x/resolver-next': [createTypeScriptImportResolver()],
      // Without these import-x reads only .js files, and no-cycle silently sees no TypeScript module.
      'import-x/extensions': ['.ts', '.tsx', '.js'],
      'import-x/parsers': { '@typescript-eslint/parser': ['.ts', '.tsx'] },
    },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
      'import-x/no-duplicates': 'error',
      // The direction of dependencies: shared ← api, shared ← web; api and web never meet.
      'import-x/no-restricted-paths': [
        'error',
        {
          zones: [
            {
              target: './shared',
              from: ['./api', './web'],
              message: 'shared/ is pure: it imports neither api/ nor web/.',
            },
            {
              // Every folder of shared/ but the schemas, so a new topic folder is covered from the start.
              target: readdirSync(new URL('./shared', import.meta.url), { withFileTypes: true })
                .filter((entry) => entry.isDirectory() && entry.name !== 'schemas')
                .map((entry) => `./shared/${entry.name}`),
              from: './shared/schemas',
              message: 'shared/ is layered: domain types and rules sit below the request schemas.',
            },
            { target: './web', from: './api', message: 'web/ talks to api/ over HTTP only.' },
            { target: './api', from: './web', message: 'api/ never imports web/.' },
            // Inside web/: shared pieces (lib, components) ← features ← app.
            ...featureZones,
            {
              target: ['./web/features', './web/lib', './web/components'],
              from: './web/app',
              message: 'Only web/app composes features into routes; nothing imports web/app.',
            },
            {
              target: ['./web/lib', './web/components'],
              from: './web/features',
              message: 'web/lib and web/components are below the features and never import them.',
            },
          ],
          basePath: root,
        },
      ],
      'import-x/no-cycle': ['error', { ignoreExternal: true }],
      'no-restricted-syntax': [
        'error',
        { selector: 'ExportDefaultDeclaration', message: 'Use named exports.' },
      ],
    },
  },
  {
    files: ['web/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks, 'jsx-a11y': jsxA11y },
    rules: { ...reactHooks.configs.recommended.rules, ...jsxA11y.flatConfigs.recommended.rules },
  },
  {
    files: ['api/**/*.ts'],
    plugins: { drizzle },
    rules: {
      'drizzle/enforce-delete-with-where': ['error', { drizzleObjectName: ['db', 'tx'] }],
      'drizzle/enforce-update-with-where': ['error', { drizzleObjectName: ['db', 'tx'] }],
    },
  },
  {
    // Tool configs and test global setups are loaded by their tools as default exports.
    files: ['*.config.{js,ts}', 'tests/helpers/global-*.ts', '**/*.d.ts'],
    rules: { 'no-restricted-syntax': 'off' },
  },
);
