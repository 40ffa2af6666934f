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

// Node and C alternate, ROUNDS times each, in one run; the best (least disturbed) time of each side is
// compared, and the median is printed too (the machine is shared, so single timings are noisy).
const ROUNDS = 5;
function nodeRound() {
  const s = createPathStepper(material);
  let sum = 0;
  const t0 = performance.now();
  for (let i = 1; i <= N; i++) { s.to(wave(i)); sum += s.state.stress; }
  return { secs: (performance.now() - t0) / 1000, sum };
}
const warm = createPathStepper(material);
for (let i = 1; i <= 200_000; i++) warm.to(wave(i));

const dir = mkdtempSync(join(tmpdir(), 'sl-bench-'));
const nodeT = [], cT = [], nodeExpT = [], cExpT = [];
const NEXP = 20_000_000;
function nodeExp() {
  let s = 0;
  const t0 = performance.now();
  for (let i = 0; i < NEXP; i++) s += Math.exp(-1e-8 * i) + Math.expm1(-2e-8 * i);
  return { secs: (performance.now() - t0) / 1000, s };
}
let sum = NaN, cSum = NaN;
try {
  const exe = join(dir, 'integrator');
  execFileSync('gcc', ['-O2', '-o', exe, join(import.meta.dirname, 'c', 'integrator.c'), '-lm']);
  const exeExp = join(dir, 'exp');
  execFileSync('gcc', ['-O2', '-o', exeExp, join(import.meta.dirname, 'c', 'exp.c'), '-lm']);
  for (let r = 0; r < ROUNDS; r++) {
    const a = nodeRound();
    nodeT.push(a.secs); sum = a.sum;
    const out = execFileSync(exe, [String(N)], { encoding: 'utf8' });
    const m = /seconds (\S+) checksum (\S+)/.exec(out);
    cT.push(Number(m[1])); cSum = Number(m[2]);
    nodeExpT.push(nodeExp().secs);
    cExpT.push(Number(/seconds (\S+)/.exec(execFileSync(exeExp, [String(NEXP)], { encoding: 'utf8' }))[1]));
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
}
const best = (a) => Math.min(...a);
const median = (a) => [...a].sort((x, y) => x - y)[Math.floor(a.length / 2)];
const agree = Math.abs(sum - cSum) <= 1e-9 * Math.abs(cSum);
console.log(`increments: ${N} per round, ${ROUNDS} rounds alternating (cycles ±${A}, increment ${H}), ${new Date().toISOString()}`);
console.log(`node ${process.version}: best ${(N / best(nodeT) / 1e6).toFixed(2)} M increments/s, median ${(N / median(nodeT) / 1e6).toFixed(2)}`);
console.log(`C gcc -O2:      best ${(N / best(cT) / 1e6).toFixed(2)} M increments/s, median ${(N / median(cT) / 1e6).toFixed(2)}`);
console.log(`ratio Node/C time: best ${(best(nodeT) / best(cT)).toFixed(2)}×, median ${(median(nodeT) / median(cT)).toFixed(2)}× (aim ≤ 2×); checksums ${agree ? 'agree' : 'DIFFER'} (${sum.toExponential(9)} vs ${cSum.toExponential(9)})`);
if (!agree) process.exitCode = 1;
console.log(`side measurement, exp + expm1 alone (${NEXP} each): Node/C time best ${(best(nodeExpT) / best(cExpT)).toFixed(2)}×, median ${(median(nodeExpT) / median(cExpT)).toFixed(2)}×`);
