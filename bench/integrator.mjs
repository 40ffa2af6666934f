// Increments per second of the 1-D return-mapping integrator (isotropic Voce law + one
// Armstrong–Frederick backstress, constant E) in Node, beside the same update in plain C compiled
// with `gcc -O2` at run time (bench/c/integrator.c), measured in one run on the same machine.
// Aim (issue 6): Node within 2× of C. Run after `npm run build`: node bench/integrator.mjs [N]
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { createPathStepper, voce } from '../dist/core/index.js';

const N = Number(process.argv[2] ?? 3_000_000);
const A = 0.02, H = 1e-4;
const quarter = Math.round(A / H);
const wave = (i) => {
  const k = i % (4 * quarter);
  if (k < quarter) return k * H;
  if (k < 3 * quarter) return (2 * quarter - k) * H;
  return (k - 4 * quarter) * H;
};
const material = { elasticModulus: 207000, law: voce({ sigma0: 250, Q: 200, b: 15 }), kinematic: { backstresses: [{ C: 20000, gamma: 200 }] } };

// Node
const warm = createPathStepper(material);
for (let i = 1; i <= 200_000; i++) warm.to(wave(i));
const s = createPathStepper(material);
let sum = 0;
const t0 = performance.now();
for (let i = 1; i <= N; i++) { s.to(wave(i)); sum += s.state.stress; }
const nodeSecs = (performance.now() - t0) / 1000;

// C, compiled now with gcc -O2 (no binary kept)
const dir = mkdtempSync(join(tmpdir(), 'sl-bench-'));
let cSecs = NaN, cSum = NaN;
try {
  const exe = join(dir, 'integrator');
  execFileSync('gcc', ['-O2', '-o', exe, join(import.meta.dirname, 'c', 'integrator.c'), '-lm']);
  const out = execFileSync(exe, [String(N)], { encoding: 'utf8' });
  const m = /seconds (\S+) checksum (\S+)/.exec(out);
  cSecs = Number(m[1]); cSum = Number(m[2]);
} finally {
  rmSync(dir, { recursive: true, force: true });
}
const agree = Math.abs(sum - cSum) <= 1e-9 * Math.abs(cSum);
console.log(`increments: ${N} (cycles ±${A}, increment ${H}), ${new Date().toISOString()}`);
console.log(`node ${process.version}: ${(N / nodeSecs / 1e6).toFixed(2)} M increments/s (${nodeSecs.toFixed(3)} s)`);
console.log(`C gcc -O2:     ${(N / cSecs / 1e6).toFixed(2)} M increments/s (${cSecs.toFixed(3)} s)`);
console.log(`ratio C/Node time: ${(nodeSecs / cSecs).toFixed(2)}× (aim ≤ 2×); checksums ${agree ? 'agree' : 'DIFFER'} (${sum.toExponential(9)} vs ${cSum.toExponential(9)})`);
if (!agree) process.exitCode = 1;
