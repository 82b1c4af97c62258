/// <reference types="vitest/config" />
import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vite';
import { VitePWA } from 'vite-plugin-pwa';

const alias = {
  '@': fileURLToPath(new URL('./src', import.meta.url)),
  '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
  '@server': fileURLToPath(new URL('./server', import.meta.url)),
};

export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
    // An installable app that opens without a network: our own service worker (src/sw.ts)
    // precaches the shell, the fonts and every route's code; main.tsx registers it.
    VitePWA({
      strategies: 'injectManifest',
      srcDir: 'src',
      filename: 'sw.ts',
      injectRegister: false,
      injectManifest: { globPatterns: ['**/*.{js,css,html,svg,png,woff2}'], maximumFileSizeToCacheInBytes: 3 * 1024 * 1024 },
      manifest: {
        name: 'Porewise',
        short_name: 'Porewise',
        description: 'Filtration planning, run tracking and cartridge care for winery cellars.',
        lang: 'en',
        start_url: '/today',
        scope: '/',
        display: 'standalone',
        theme_color: '#1b535e',
        background_color: '#f8fafc',
        icons: [
          { src: '/icons/icon-192.png', sizes: '192x192', type: 'image/png' },
          { src: '/icons/icon-512.png', sizes: '512x512', type: 'image/png' },
          { src: '/icons/icon-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
          { src: '/icons/icon.svg', sizes: 'any', type: 'image/svg+xml' },
        ],
      },
    }),
  ],
  resolve: { alias },
  server: {
    host: '127.0.0.1',
    port: 5173,
    proxy: { '/api': `http://127.0.0.1:${process.env.PORT ?? 3000}` },
  },
  build: {
    outDir: 'dist/client',
    emptyOutDir: true,
    chunkSizeWarningLimit: 900,
    // The engine is pure (no work at import: ESLint keeps it so), so a page that imports one
    // helper through shared/engine/index.ts bundles that helper's modules and no others.
    rolldownOptions: { treeshake: { moduleSideEffects: [{ test: /[\\/]shared[\\/]engine[\\/]/, sideEffects: false }] } },
  },
  test: {
    reporters: ['default'],
    projects: [
      {
        resolve: { alias },
        test: { name: 'shared', environment: 'node', include: ['shared/**/*.test.ts'] },
      },
      {
        resolve: { alias },
        plugins: [react()],
        test: {
          name: 'client',
          environment: 'jsdom',
          include: ['src/**/*.test.{ts,tsx}'],
          setupFiles: ['tests/setup/client.ts'],
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'server',
          environment: 'node',
          include: ['server/**/*.test.ts', 'tests/integration/**/*.test.ts'],
          globalSetup: ['tests/setup/global-db.ts'],
          fileParallelism: false,
          // One worker keeps its imported modules from file to file: the app (Express, the S3
          // client, the job queue …) is loaded once instead of once per file (about 5 s each).
          // Each file still starts its own app, winery and queue schema; no test mocks modules.
          isolate: false,
          // Own groups (vitest wants one per worker count): after the unit tests, before e2e.
          sequence: { groupOrder: 1 },
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        // Faults (database restart, SIGKILL, stopping npm start) run after everything else, so a
        // restarted cluster never disturbs another test (`npm test` runs them in a vitest run of
        // their own, after the others).
        resolve: { alias },
        test: {
          name: 'faults',
          environment: 'node',
          include: ['tests/faults/**/*.test.ts'],
          globalSetup: ['tests/setup/global-db.ts'],
          fileParallelism: false,
          sequence: { groupOrder: 3 },
          testTimeout: 120_000,
          hookTimeout: 120_000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'e2e',
          environment: 'node',
          include: ['tests/e2e/**/*.test.ts'],
          globalSetup: ['tests/setup/global-db.ts'],
          fileParallelism: false,
          // As the server project: modules (playwright-core, the app) imported once per run.
          isolate: false,
          sequence: { groupOrder: 2 },
          // A browser test that times out while the whole suite loads both cores runs once more
          // (each test sets up its own winery); a failure that repeats still fails the run.
          retry: 1,
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
