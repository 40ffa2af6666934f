import { defineConfig } from 'vite';

/**
 * The shipped runner as a few bundled ES modules (dist/runner/), built by `npm run build` after tsc.
 * One entry file holds the command registry and argument handling; zod, yaml, the writers, Plot and
 * linkedom sit in chunks loaded on demand (`import()` in the commands), so `run --format json` does
 * not read the chart code. Measured effect on start-up: bench/RESULTS.md, "Runner cold start".
 */
export default defineConfig({
  logLevel: 'warn',
  build: {
    ssr: 'src/cli/main.ts',
    outDir: 'dist/runner',
    // Not emptied: other test runs may be reading the previous build; stable chunk names overwrite it in place.
    emptyOutDir: false,
    target: 'node20',
    minify: false,
    sourcemap: false,
    rollupOptions: {
      output: { format: 'es', entryFileNames: 'main.js', chunkFileNames: 'chunks/[name].js' },
    },
  },
  ssr: { target: 'node', noExternal: true },
});
