import { readdirSync } from 'node:fs';
import js from '@eslint/js';
import importX from 'eslint-plugin-import-x';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

const featuresOf = (dir) => readdirSync(dir, { withFileTypes: true }).filter((d) => d.isDirectory()).map((d) => d.name);

// Features never import each other: what two features share lives in lib/ or components/ (web)
// or in packages/ (api). One zone per feature keeps the rule true as features are added.
const featureZones = ['apps/web/src/features', 'apps/api/src/features'].flatMap((root) =>
  featuresOf(root).map((name) => ({
    target: `./${root}/${name}`,
    from: `./${root}`,
    except: [`./${name}`],
    message: 'Features do not import each other; move the shared part to lib/, components/ or a package.',
  })),
);

const processEnv = {
  selector: "MemberExpression[object.name='process'][property.name='env']",
  message: 'Read settings in env.ts only (zod-validated), and pass them in.',
};

export default tseslint.config(
  { ignores: ['**/node_modules/**', '**/dist/**', '.data/**', 'drizzle/**', 'test-artifacts/**', '**/*.fixture*'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node } },
    plugins: { 'import-x': importX },
    settings: { 'import-x/resolver': { node: { extensions: ['.ts', '.tsx', '.js', '.mjs'] } } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
      'import-x/no-restricted-paths': ['error', { zones: featureZones }],
      'no-restricted-syntax': ['error', processEnv],
    },
  },
  {
    files: ['apps/web/src/**/*.{ts,tsx}'],
    languageOptions: { globals: { ...globals.browser } },
    plugins: { 'react-hooks': reactHooks },
    rules: { 'react-hooks/rules-of-hooks': 'error', 'react-hooks/exhaustive-deps': 'error' },
  },
  {
    files: ['apps/api/src/features/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          paths: [
            { name: '@rinkwright/db/unscoped', message: 'Feature code reaches tenant data through scoped(tenantId) only.' },
            { name: 'mysql2', message: 'Feature code reaches the database through repositories and scoped().' },
            { name: 'mysql2/promise', message: 'Feature code reaches the database through repositories and scoped().' },
            { name: 'drizzle-orm/mysql2', message: 'Feature code does not build its own client.' },
          ],
        },
      ],
    },
  },
  // Settings readers, and the scripts and tests that launch processes with an environment of their own.
  { files: ['**/env.ts', 'scripts/**', 'tests/support/env.ts', 'tests/setup/**'], rules: { 'no-restricted-syntax': 'off' } },
);
