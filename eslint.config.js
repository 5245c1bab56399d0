// ESLint flat config. The import boundaries are the ones in DEVELOPERS.md ("Boundaries").
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import { importX } from 'eslint-plugin-import-x';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';

const featureZones = (features) =>
  features.map((f) => ({
    target: `./web/src/features/${f}`,
    from: './web/src/features',
    except: [`./${f}`],
    message: 'A feature never imports another feature; features meet in web/src/app.',
  }));

export default tseslint.config(
  {
    ignores: [
      'node_modules/**',
      'dist/**',
      '.data/**',
      'test-results/**',
      'bench-results/**',
      'test/fixtures/**',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    plugins: { 'import-x': importX },
    settings: {
      'import-x/resolver-next': [createTypeScriptImportResolver({ project: './tsconfig.json' })],
    },
    languageOptions: {
      ecmaVersion: 2023,
      sourceType: 'module',
      globals: { ...globals.node, ...globals.browser },
    },
    rules: {
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_' },
      ],
      '@typescript-eslint/no-explicit-any': 'error',
      'import-x/no-cycle': ['error', { maxDepth: 8, ignoreExternal: true }],
      'import-x/no-restricted-paths': [
        'error',
        {
          zones: [
            {
              target: './core',
              from: ['./api', './web', './scripts', './migrations', './seeds', './test'],
              message: 'core/ is pure: it imports nothing from the other folders.',
            },
            {
              target: ['./api', './web', './scripts', './seeds'],
              from: './core',
              except: ['./index.ts', './threads.ts', './engine.ts'],
              message:
                'Import core/ only through core/index.ts (helper threads: core/threads.ts; the solver alone, without the sheet engine: core/engine.ts).',
            },
            {
              target: './web',
              from: ['./api', './migrations', './seeds'],
              message: 'The client talks to the server over HTTP only.',
            },
            ...featureZones([
              'auth',
              'projects',
              'members',
              'sheets',
              'editor',
              'revisions',
              'review',
              'seal',
              'verify',
              'print',
              'admin',
              'outbox',
              'activity',
            ]),
          ],
        },
      ],
    },
  },
  {
    // core/: no I/O, no Node built-ins, no clock, no Math.random.
    files: ['core/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['node:*'], message: 'core/ does no I/O.' },
            {
              group: [
                'fs',
                'path',
                'os',
                'crypto',
                'child_process',
                'worker_threads',
                'knex',
                'mysql2',
                'express',
                'http',
                'https',
                'net',
              ],
              message: 'core/ does no I/O.',
            },
          ],
        },
      ],
      'no-restricted-properties': [
        'error',
        { object: 'Math', property: 'random', message: 'Pass a seeded generator in.' },
        { object: 'Date', property: 'now', message: 'core/ has no clock.' },
      ],
      'no-restricted-syntax': [
        'error',
        { selector: "NewExpression[callee.name='Date']", message: 'core/ has no clock.' },
      ],
    },
  },
  {
    // Only repositories and api/db talk to Knex.
    files: ['api/**/*.ts', 'web/**/*.{ts,tsx}'],
    ignores: ['api/db/**', 'api/**/*.repository.ts'],
    rules: {
      '@typescript-eslint/no-restricted-imports': [
        'error',
        {
          paths: [
            {
              name: 'knex',
              message: 'Only repositories and api/db import Knex.',
              allowTypeImports: true,
            },
            { name: 'mysql2', message: 'Only api/db talks to the driver.' },
          ],
        },
      ],
    },
  },
  {
    files: ['web/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'error',
    },
  },
);
