// Lint with the layer boundaries of the project: shared may not import src or server; src may
// not import server; features may not import each other.
import { readdirSync } from 'node:fs';
import js from '@eslint/js';
import importPlugin from 'eslint-plugin-import';
import tseslint from 'typescript-eslint';

const features = readdirSync(new URL('./src/features', import.meta.url), { withFileTypes: true })
  .filter((d) => d.isDirectory())
  .map((d) => d.name);
// Everything in shared/ beside the engine itself (folders and top-level files), so a new folder is covered too.
const sharedOutsideEngine = readdirSync(new URL('./shared', import.meta.url), { withFileTypes: true })
  .filter((d) => d.name !== 'engine')
  .map((d) => `./shared/${d.name}`);

const drizzleOnlyInRepositories = {
  group: ['drizzle-orm', 'drizzle-orm/*', 'pg'],
  message: 'Only repositories (*.repository.ts) and server/db/ use Drizzle: go through a repository.',
};
const schemaOnlyInRepositories = {
  group: ['**/db/schema', '**/db/schema/*'],
  allowTypeImports: true,
  message: 'Only repositories (*.repository.ts), seeds and server/db/ use the tables: go through a repository.',
};
const otherModulesRepository = {
  // ../x/ from a module, ../modules/x/ from server/jobs or server/lib, ../../modules/x/ from deeper folders.
  group: ['../*/*.repository', '../modules/*/*.repository', '../../modules/*/*.repository'],
  allowTypeImports: true,
  message: "A module uses another module through its service, never through that module's repository.",
};
// Handlers get their input from withBody/withQuery (server/middleware/validate.ts), typed by the schema.
const typedInputOnly = [
  {
    selector: "MemberExpression[object.type='MemberExpression'][object.property.name='locals'][property.name=/^(body|query)$/]",
    message: 'Take the parsed input from withBody(schema, (req, res, body) => …) or withQuery: res.locals is untyped.',
  },
];

/** Dates are shown through src/lib/dates.ts only. */
const dateFnsFormats = {
  name: 'date-fns',
  importNames: ['format', 'formatDistance', 'formatDistanceStrict', 'formatDistanceToNow', 'formatDistanceToNowStrict', 'formatRelative', 'intlFormat', 'lightFormat'],
  message: 'Show dates with src/lib/dates.ts (date-fns in the person’s locale).',
};
/** Charts load after the page paints: the charting library only in `*-chart.tsx` files, and those only through lazyChart. */
const chartLibrary = { name: 'recharts', message: 'Draw charts in a *-chart.tsx file and show it through lazyChart (src/components/ui/lazy-chart.tsx).' };
// record-chart draws plain SVG for the printed record (no charting library), so it loads with its page.
const chartFiles = { group: ['**/*-chart', '!**/lazy-chart', '!**/record-chart'], message: 'Load chart components with lazyChart (src/components/ui/lazy-chart.tsx), so the page paints first.' };

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
      'import/parsers': { '@typescript-eslint/parser': ['.ts', '.tsx'] },
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
            {
              target: ['./src', './server', './scripts', './tests', ...sharedOutsideEngine],
              from: './shared/engine',
              except: ['./index.ts'],
              message: 'Import the engine through its public surface, shared/engine/index.ts (`@shared/engine`).',
            },
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
    // No import cycles anywhere (layers and modules stay a tree).
    // Table files may reference each other (users ↔ wineries): Drizzle's references are lazy callbacks.
    files: ['**/*.{ts,tsx}'],
    ignores: ['server/db/schema/**'],
    rules: { 'import/no-cycle': ['error', { ignoreExternal: true }] },
  },
  {
    // Server layering: Drizzle and the tables only in repositories and server/db/ (client, schema,
    // seeds, list and error helpers); a module uses another module through its service. Types of
    // the stored JSON shapes and rows may be imported (no runtime coupling).
    files: ['server/**/*.ts'],
    ignores: ['server/**/*.repository.ts', 'server/db/**', 'server/**/*.test.ts', 'server/lib/auth.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [drizzleOnlyInRepositories, schemaOnlyInRepositories, otherModulesRepository] }],
      'no-restricted-syntax': ['error', ...typedInputOnly],
    },
  },
  {
    // Lucia's Drizzle adapter and the one-query session read are set up with the tables here.
    files: ['server/lib/auth.ts'],
    rules: { 'no-restricted-imports': ['error', { patterns: [otherModulesRepository] }] },
  },
  {
    files: ['server/**/*.repository.ts', 'server/**/*.test.ts'],
    rules: { 'no-restricted-imports': ['error', { patterns: [otherModulesRepository] }] },
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
      'no-restricted-imports': ['error', { paths: [dateFnsFormats, chartLibrary], patterns: [chartFiles] }],
    },
  },
  {
    // The chart files themselves draw with the charting library (and are loaded with lazyChart).
    files: ['src/**/*-chart.tsx'],
    ignores: ['src/**/*.test.{ts,tsx}'],
    rules: { 'no-restricted-imports': ['error', { paths: [dateFnsFormats], patterns: [chartFiles] }] },
  },
);
