import { defineConfig } from 'vitest/config';

// One config for the notebook dev server (vite) and the tests (vitest).
export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    environment: 'node',
    globalSetup: ['test/globalSetup.ts'],
    testTimeout: 60_000,
    hookTimeout: 120_000,
  },
});
