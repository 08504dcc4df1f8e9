import js from '@eslint/js';
import angular from 'angular-eslint';
import prettier from 'eslint-config-prettier';
import tseslint from 'typescript-eslint';
import boundaries from 'eslint-plugin-boundaries';

export default tseslint.config(
  { ignores: ['dist/', '.angular/', 'node_modules/', '.data/', 'artifacts/', 'coverage/'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  prettier,
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
    },
  },
  // The three rooms and their one direction: shared/ depends on nothing of ours; the app never
  // reaches into the server; only repositories (and the database set-up) use knex itself.
  {
    files: ['shared/**/*.ts', 'server/**/*.ts', 'src/**/*.ts'],
    plugins: { boundaries },
    settings: {
      'import/resolver': { node: { extensions: ['.ts', '.js', '.mjs'] } },
      'boundaries/elements': [
        { type: 'shared', pattern: 'shared', partialMatch: false },
        // A server feature's folder (server/jobs, server/board …) and, in the app, a feature's
        // component folders (features/board/assignment-card …) apart from its top-level files.
        { type: 'server', pattern: 'server/*', capture: ['feature'], partialMatch: false },
        { type: 'server', pattern: 'server', partialMatch: false },
        { type: 'app-component', pattern: 'src/app/features/*/*', capture: ['feature', 'folder'], partialMatch: false },
        { type: 'app', pattern: 'src/app/features/*', capture: ['feature'], partialMatch: false },
        { type: 'app', pattern: 'src', partialMatch: false },
      ],
      'boundaries/files': [
        { category: 'data-access', pattern: ['server/**/*.repository.ts', 'server/db/**', 'server/**/*.read.ts'] },
        { category: 'route-or-service', pattern: ['server/**/*.routes.ts', 'server/**/*.service.ts'] },
      ],
    },
    rules: {
      'boundaries/dependencies': [
        'error',
        {
          default: 'allow',
          checkAllOrigins: true,
          policies: [
            {
              from: { element: { type: 'shared' } },
              disallow: { to: { element: { types: { anyOf: ['server', 'app', 'app-component'] } } } },
            },
            { from: { element: { types: { anyOf: ['app', 'app-component'] } } }, disallow: { to: { element: { type: 'server' } } } },
            { from: { file: { categories: 'route-or-service' } }, disallow: { to: { module: { origin: 'external', source: 'knex' } } } },
            // The job itself is what board, run sheet and season stand on, never the other way.
            {
              from: { element: { type: 'server', captured: { feature: 'jobs' } } },
              disallow: { to: { element: { type: 'server', captured: { feature: ['board', 'run-sheet', 'season'] } } } },
            },
            // A feature's components are its own: another feature may use its top-level files (its
            // API service, its helpers), not reach into its component folders. Test fixtures aside.
            {
              from: { element: { types: { anyOf: ['app', 'app-component'] }, captured: { feature: '*' } } },
              disallow: {
                to: { element: { type: 'app-component', captured: { feature: '!{{ from.captured.feature }}', folder: '!testing' } } },
              },
            },
          ],
        },
      ],
    },
  },
  // The server, shared code, scripts and tests: the type-checked promise rules (a dropped promise
  // hides a failure; an async function where a callback's result is ignored loses its error).
  {
    files: ['server/**/*.ts', 'shared/**/*.ts', 'scripts/**/*.ts', 'tests/**/*.ts', 'migrations/**/*.ts', 'seeds/**/*.ts'],
    ignores: ['tests/browser/**'],
    languageOptions: { parserOptions: { project: ['./tsconfig.server.json'], tsconfigRootDir: import.meta.dirname } },
    rules: { '@typescript-eslint/no-floating-promises': 'error', '@typescript-eslint/no-misused-promises': 'error' },
  },
  {
    files: ['tests/browser/**/*.ts'],
    languageOptions: { parserOptions: { project: ['./tsconfig.e2e.json'], tsconfigRootDir: import.meta.dirname } },
    rules: { '@typescript-eslint/no-floating-promises': 'error', '@typescript-eslint/no-misused-promises': 'error' },
  },
  {
    files: ['**/*.js', '**/*.mjs', '**/*.cjs'],
    languageOptions: {
      globals: {
        process: 'readonly',
        console: 'readonly',
        __dirname: 'readonly',
        module: 'writable',
        require: 'readonly',
        fetch: 'readonly',
        setTimeout: 'readonly',
        URL: 'readonly',
      },
    },
    rules: { '@typescript-eslint/no-require-imports': 'off' },
  },
  {
    // The Angular app: angular-eslint's recommended rules, inline templates linted as templates, and
    // the type-checked promise rules (a dropped navigate() or an async handler in a void slot hides
    // failures). The same promise rules cover the rest of the TypeScript above.
    files: ['src/**/*.ts'],
    extends: [...angular.configs.tsRecommended],
    processor: angular.processInlineTemplates,
    languageOptions: {
      parserOptions: {
        project: ['./tsconfig.app.json', './tsconfig.spec.json'],
        tsconfigRootDir: import.meta.dirname,
      },
    },
    rules: {
      '@angular-eslint/component-selector': ['error', { type: 'element', prefix: 'app', style: 'kebab-case' }],
      '@angular-eslint/directive-selector': ['error', { type: 'attribute', prefix: 'app', style: 'camelCase' }],
      '@angular-eslint/prefer-on-push-component-change-detection': 'error',
      '@typescript-eslint/no-floating-promises': 'error',
      '@typescript-eslint/no-misused-promises': 'error',
    },
  },
  // One way to show a number: every figure a person reads is written by shared/figures.ts (or the
  // money and file-size formatters beside it). toFixed rounds the binary double (822.65 → "822.6")
  // and a hand-made figure drifts from the same figure elsewhere (55.18 h on one screen, 55.2 h on
  // another). scripts/lint-rules.spec.ts shows the rule fires.
  {
    files: ['src/**/*.ts', 'server/**/*.ts', 'shared/**/*.ts'],
    ignores: ['shared/figures.ts', '**/*.spec.ts'],
    rules: {
      'no-restricted-syntax': [
        'error',
        {
          selector: "CallExpression[callee.property.name='toFixed']",
          message: 'Write figures with shared/figures.ts (figure, formatAcres, formatHours, formatWind …), not toFixed.',
        },
        {
          selector: "NewExpression[callee.object.name='Intl'][callee.property.name='NumberFormat']",
          message: 'Write figures with shared/figures.ts (figure, formatCount, formatAreaRate …), not a number format of your own.',
        },
        {
          // zod 4's named `z` is a namespace the bundler cannot trim: it kept all of zod (its error
          // messages in forty languages too) in the phone's first download, 350 kB of 1.08 MB.
          selector: "ImportDeclaration[source.value='zod'] > ImportSpecifier[imported.name='z']",
          message: "Import zod as a namespace (import * as z from 'zod') so the app's bundle keeps only the parts it uses.",
        },
      ],
    },
  },
  {
    files: ['src/**/*.html'],
    extends: [...angular.configs.templateRecommended, ...angular.configs.templateAccessibility],
    // The shared rules block above applies to every file; this one reads TypeScript imports and
    // has nothing to check in a template (it would stop on the template parser instead).
    rules: { '@typescript-eslint/consistent-type-imports': 'off' },
  },
);
