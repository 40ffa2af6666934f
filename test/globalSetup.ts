import { execFileSync } from 'node:child_process';
import { join } from 'node:path';

/** Builds dist/ once before all tests: the runner tests run the shipped JavaScript, as users do. */
export default function setup(): void {
  // Emits even with type errors (they are reported by `npm run typecheck`, part of `npm test`).
  try {
    execFileSync(process.execPath, [join('node_modules', 'typescript', 'bin', 'tsc'), '-p', 'tsconfig.build.json'], { cwd: join(import.meta.dirname, '..'), stdio: 'inherit' });
  } catch {
    console.warn('tsc reported type errors; dist/ was still emitted');
  }
  // The shipped runner (bin/strainledger.js) is the vite bundle in dist/runner/ (vite.runner.config.ts).
  execFileSync(process.execPath, [join('node_modules', 'vite', 'bin', 'vite.js'), 'build', '-c', 'vite.runner.config.ts'], { cwd: join(import.meta.dirname, '..'), stdio: 'inherit' });
}
