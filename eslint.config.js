// ESLint 9 flat config. Besides the usual TypeScript and React hooks rules it keeps the layering
// true (see DEVELOPERS.md "Layout" and docs/decisions/): src/lib stays pure, pages and components
// never reach the database. npm run lint; npm test runs it before the tests.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import astro from 'eslint-plugin-astro';
import importX from 'eslint-plugin-import-x';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import globals from 'globals';

/** Packages that tie code to the server, the framework or the database: never in src/lib. */
const notInLib = ['astro', 'astro:*', 'astro/*', 'react', 'react-dom', 'react/*', 'drizzle-orm', 'drizzle-orm/*', 'pg', 'pg-boss', '@aws-sdk/*', 'lucia', 'nodemailer', 'stripe', 'fluent-ffmpeg'];

export default tseslint.config(
  { ignores: ['dist/**', '.data/**', '.astro/**', 'node_modules/**', 'public/**', 'drizzle/**'] },

  js.configs.recommended,
  ...tseslint.configs.recommended,
  ...astro.configs['flat/recommended'],

  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    plugins: { 'import-x': importX },
    settings: {
      'import-x/resolver-next': [createTypeScriptImportResolver({ project: './tsconfig.json' })],
    },
    rules: {
      // Unused names are usually leftovers; a leading underscore marks an intentional one.
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none', ignoreRestSiblings: true }],
      // Type-only imports vanish from the bundle; this keeps server types out of browser code.
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
      'import-x/no-duplicates': 'error',
    },
  },

  // React islands: the Rules of Hooks and the React Compiler's purity checks, all as errors.
  {
    files: ['src/components/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      ...reactHooks.configs.flat.recommended.rules,
      'react-hooks/exhaustive-deps': 'error',
      // Only says the React Compiler would skip a component; the app does not run the compiler.
      'react-hooks/preserve-manual-memoization': 'off',
    },
  },
  // Ambient declaration files cannot have top-level imports without becoming modules.
  {
    files: ['**/*.d.ts'],
    rules: { '@typescript-eslint/consistent-type-imports': ['error', { disallowTypeAnnotations: false }] },
  },

  // src/lib is pure: it runs in the browser, in the worker and in unit tests alike.
  {
    files: ['src/lib/**/*.{ts,tsx}'],
    rules: {
      'import-x/no-nodejs-modules': 'error',
      'import-x/no-restricted-paths': ['error', {
        zones: [{
          target: './src/lib',
          from: ['./src/server', './src/pages', './src/db', './src/components', './src/layouts', './src/scripts', './src/middleware.ts', './src/worker.ts'],
          message: 'src/lib is pure: move the side effect to src/server and pass its result in.',
        }],
      }],
      'no-restricted-imports': ['error', {
        patterns: [{ group: notInLib, message: 'src/lib imports no framework, database or server package.' }],
      }],
    },
  },

  // Pages, layouts and components go through services; they never query tables themselves.
  {
    files: ['src/pages/**/*.{ts,tsx,astro}', 'src/components/**/*.{ts,tsx,astro}', 'src/layouts/**/*.astro'],
    rules: {
      'import-x/no-restricted-paths': ['error', {
        zones: [{
          target: ['./src/pages', './src/components', './src/layouts'],
          from: ['./src/db', './src/server/db.ts'],
          message: 'Pages and components call a service in src/server/services instead of the database.',
        }],
      }],
      'no-restricted-imports': ['error', {
        patterns: [{ group: ['drizzle-orm', 'drizzle-orm/*', 'pg'], message: 'No SQL in pages or components: call a service.' }],
      }],
    },
  },

  // Islands run in the browser: no server code at all.
  {
    files: ['src/components/islands/**/*.{ts,tsx}'],
    rules: {
      'import-x/no-nodejs-modules': 'error',
      'import-x/no-restricted-paths': ['error', {
        zones: [{
          target: './src/components/islands',
          from: ['./src/server', './src/db', './src/pages'],
          message: 'Islands run in the browser: share types and schemas through src/lib.',
        }],
      }],
    },
  },
);
