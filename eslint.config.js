// Lint with the layer boundaries of the project: shared may not import src or server; src may
// not import server; features may not import each other.
import { readdirSync } from 'node:fs';
import js from '@eslint/js';
import importPlugin from 'eslint-plugin-import';
import tseslint from 'typescript-eslint';

const features = readdirSync(new URL('./src/features', import.meta.url), { withFileTypes: true })
  .filter((d) => d.isDirectory())
  .map((d) => d.name);

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', '.data/**', 'test-output/**', 'drizzle/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  { files: ['**/*.{js,mjs}'], languageOptions: { globals: { process: 'readonly', console: 'readonly', URL: 'readonly' } } },
  {
    files: ['**/*.{ts,tsx}'],
    plugins: { import: importPlugin },
    settings: {
      'import/resolver': { typescript: { project: './tsconfig.json' }, node: true },
    },
    rules: {
      '@typescript-eslint/no-explicit-any': 'off',
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'import/no-restricted-paths': [
        'error',
        {
          zones: [
            { target: './shared', from: './src', message: 'shared/ is isomorphic: it may not import the client.' },
            { target: './shared', from: './server', message: 'shared/ is isomorphic: it may not import the server.' },
            { target: './src', from: './server', message: 'The client may not import server code.' },
            { target: './server', from: './src', message: 'The server may not import client code.' },
            ...features.map((f) => ({
              target: `./src/features/${f}`,
              from: './src/features',
              except: [`./${f}`],
              message: 'Features may not import each other; share through components/, lib/ or shared/.',
            })),
          ],
        },
      ],
    },
  },
  {
    files: ['shared/engine/**/*.ts'],
    ignores: ['shared/engine/**/*.test.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        { patterns: [{ group: ['node:*', 'express', 'react', 'react-dom', 'drizzle-orm', 'pg'], message: 'The engine is pure: mathjs and zod only.' }] },
      ],
      'no-restricted-globals': ['error', { name: 'Date', message: 'No clock inside calculations: take the time as an argument.' }],
    },
  },
  {
    // One date format in the client: every date is shown through src/lib/dates.ts.
    files: ['src/**/*.{ts,tsx}'],
    ignores: ['src/lib/dates.ts', 'src/**/*.test.{ts,tsx}'],
    rules: {
      'no-restricted-syntax': [
        'error',
        { selector: "CallExpression[callee.property.name=/^toLocale(Date|Time)String$/]", message: 'Show dates with src/lib/dates.ts (date-fns in the person’s locale).' },
        {
          selector: "CallExpression[callee.property.name='toLocaleString'] > ObjectExpression > Property[key.name=/^(weekday|day|month|year|hour|minute|second|dateStyle|timeStyle)$/]",
          message: 'Show dates with src/lib/dates.ts (date-fns in the person’s locale).',
        },
        { selector: "CallExpression[callee.property.name='slice'][callee.object.callee.property.name='toISOString']", message: 'Use toDayInput() from src/lib/dates.ts: toISOString is the UTC day, not the person’s.' },
      ],
      'no-restricted-imports': [
        'error',
        {
          paths: [
            {
              name: 'date-fns',
              importNames: ['format', 'formatDistance', 'formatDistanceStrict', 'formatDistanceToNow', 'formatDistanceToNowStrict', 'formatRelative', 'intlFormat', 'lightFormat'],
              message: 'Show dates with src/lib/dates.ts (date-fns in the person’s locale).',
            },
          ],
        },
      ],
    },
  },
);
