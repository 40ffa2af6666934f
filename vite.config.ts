import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const repo = fileURLToPath(new URL('.', import.meta.url));
const page = (p: string) => fileURLToPath(new URL(`./notebooks/${p}`, import.meta.url));

// One config for the notebook dev server and build (vite) and the tests (vitest).
// The notebook settings (root = notebooks/) apply to every mode but vitest's own ('test'), so the
// tests keep the repository root; the browser tests start the server with mode 'development'.
export default defineConfig(({ mode }) => ({
  test: {
    include: ['test/**/*.test.ts'],
    environment: 'node',
    globalSetup: ['test/globalSetup.ts'],
    // Goldens (test/cli/golden/) are written only on request (`-u`): a missing golden fails
    // instead of being written by the run that compares against it.
    update: 'none',
    testTimeout: 60_000,
    hookTimeout: 120_000,
  },
  ...(mode === 'test' ? {} : {
    root: page(''),
    publicDir: false as const,
    // Several pages, no single-page fallback: an unknown path is a 404, not the index page.
    appType: 'mpa' as const,
    // Pre-bundle up front so a first visit never triggers a reload for newly found dependencies.
    optimizeDeps: { include: ['@observablehq/runtime', '@observablehq/plot', 'zod', 'yaml'] },
    server: { host: '127.0.0.1', fs: { allow: [repo] } },
    preview: { host: '127.0.0.1' },
    build: {
      outDir: fileURLToPath(new URL('./dist/notebooks', import.meta.url)),
      emptyOutDir: true,
      rollupOptions: {
        input: {
          index: page('index.html'),
          prestrain: page('prestrain/index.html'),
          route: page('route/index.html'),
          records: page('records/index.html'),
          design: page('design/index.html'),
          scatter: page('scatter/index.html'),
          reversal: page('reversal/index.html'),
        },
      },
    },
  }),
}));
