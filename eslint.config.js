// ESLint flat config. The import boundaries are the ones in DEVELOPERS.md ("Boundaries").
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import { importX } from 'eslint-plugin-import-x';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import { readdirSync } from 'node:fs';

// The folders are the list: a new feature or resource is fenced in the day it is made.
const foldersOf = (dir) =>
  readdirSync(new URL(dir, import.meta.url), { withFileTypes: true })
    .filter((d) => d.isDirectory())
    .map((d) => d.name);

const featureZones = foldersOf('./web/src/features/').map((f) => ({
  target: `./web/src/features/${f}`,
  from: './web/src/features',
  except: [`./${f}`],
  message: 'A feature never imports another feature; features meet in web/src/app.',
}));

const noDriver = [
  { name: 'knex', message: 'Only repositories and api/db import Knex.', allowTypeImports: true },
  { name: 'mysql2', message: 'Only api/db talks to the driver.' },
];

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
              except: [
                './index.ts',
                './threads.ts',
                './engine.ts',
                './vocabulary.ts',
                './display-units.ts',
                './contract',
              ],
              message:
                'Import core/ only through core/index.ts (helper threads: core/threads.ts; the solver alone, without the sheet engine: core/engine.ts; the stored words: core/vocabulary.ts; the response shapes: core/contract/).',
            },
            {
              target: './core/vocabulary.ts',
              from: ['./core', './api', './web'],
              message: 'core/vocabulary.ts is the words both sides read: it imports nothing.',
            },
            {
              target: './core/contract',
              from: ['./core', './api', './web'],
              except: ['./vocabulary.ts', './contract'],
              message:
                'core/contract/ is the response shapes both sides read: it imports zod and core/vocabulary.ts only.',
            },
            {
              target: './core/display-units.ts',
              from: ['./core', './api', './web'],
              message: 'core/display-units.ts is read by both sides: it imports nothing.',
            },
            {
              target: './web',
              from: ['./api', './migrations', './seeds'],
              message: 'The client talks to the server over HTTP only.',
            },
            // Shared code of the client serves every feature and knows none of them.
            {
              target: ['./web/src/components', './web/src/lib', './web/src/config'],
              from: ['./web/src/features', './web/src/app'],
              message:
                'Shared client code never imports a feature or the app; pass what it needs in.',
            },
            {
              target: './web/src/features',
              from: './web/src/app',
              message: 'Features do not import the app; the app composes the features.',
            },
            // The layers of a resource point down: routes → services → repositories → db.
            {
              target: './api/modules/**/*.repository.ts',
              from: ['./api/modules/**/*.service.ts', './api/modules/**/*.routes.ts'],
              message: 'A repository owns SQL only; it never calls a service or a route.',
            },
            {
              target: './api/modules/**/*.service.ts',
              from: './api/modules/**/*.routes.ts',
              message: 'A service never imports a route.',
            },
            {
              target: ['./api/http', './api/mail', './api/workers', './api/db', './api/config'],
              from: ['./api/app.ts', './api/app-context.ts', './api/server.ts'],
              message: 'Infrastructure does not import the app that composes it.',
            },
            ...featureZones,
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
      '@typescript-eslint/no-restricted-imports': ['error', { paths: noDriver }],
    },
  },
  {
    // Infrastructure is free of resources: what it needs from them is handed in by createApp
    // (types excepted: the signed-in person's shape).
    files: ['api/http/**/*.ts', 'api/mail/**/*.ts', 'api/workers/**/*.ts'],
    rules: {
      '@typescript-eslint/no-restricted-imports': [
        'error',
        {
          paths: noDriver,
          patterns: [
            {
              group: ['**/modules/**'],
              allowTypeImports: true,
              message:
                'Infrastructure imports no resource module; createApp hands it what it needs.',
            },
          ],
        },
      ],
    },
  },
  {
    // The client may read the engine's types, never its runtime (mathjs stays on the server);
    // values both sides need live in core/vocabulary.ts and core/display-units.ts, which import
    // nothing.
    files: ['web/**/*.{ts,tsx}'],
    rules: {
      '@typescript-eslint/no-restricted-imports': [
        'error',
        {
          paths: noDriver,
          patterns: [
            {
              // Any path into core/ except the two modules that import nothing (one expression: a
              // gitignore group that excludes the folder `core` cannot re-include a file inside it).
              // core/contract/ falls under it: the client reads the response shapes as types
              // (z.infer), never zod's runtime.
              regex: '(^|/)core(/(?!(vocabulary|display-units)(\\.ts)?$).*)?$',
              allowTypeImports: true,
              message:
                'The client imports core/ as types only (import type), the response shapes of core/contract/ included; shared values live in core/vocabulary.ts and core/display-units.ts.',
            },
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
