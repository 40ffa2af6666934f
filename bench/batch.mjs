// Batch throughput: 1,000 generated plans (INVENTED variations of the copper-strip demo: different
// pass reductions, an anneal in some), `strainledger run 'DIR/*.json' --jobs 1` versus `--jobs 2`,
// side by side in one run (alternating, median of the rounds). Also with --out and --format html,
// where each plan's work is heavier (Plot charts on linkedom) and threads pay off more.
// Run: npm run build && node bench/batch.mjs [plans=1000] [rounds=3]
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const ROOT = new URL('..', import.meta.url).pathname;
const N = Number(process.argv[2] ?? 1000);
const ROUNDS = Number(process.argv[3] ?? 3);
const dir = mkdtempSync(join(tmpdir(), 'sl-batch-'));
for (let i = 0; i < N; i++) {
  const r1 = 10 + (i % 20);
  const r2 = 5 + ((i * 7) % 25);
  const steps = [{ kind: 'roll', reductionPct: r1 }, { kind: 'roll', reductionPct: r2 }];
  if (i % 3 === 0) steps.push({ kind: 'anneal' }, { kind: 'roll', reductionPct: 15 + (i % 10) });
  writeFileSync(join(dir, `plan-${String(i).padStart(4, '0')}.json`), JSON.stringify({
    name: `batch bench plan ${i} (INVENTED)`, units: 'SI',
    material: { name: 'copper, annealed (Callister handbook law)', elasticModulus: 115000, flowCurve: { law: 'hollomon', K: 530, n: 0.44 } },
    start: { thickness: 2, width: 40 }, steps, targets: { minYield: 300, maxYield: 470 },
  }));
}
const median = (a) => { const s = [...a].sort((x, y) => x - y); return s[(s.length - 1) >> 1]; };
function time(args) {
  const t0 = process.hrtime.bigint();
  const r = spawnSync(process.execPath, ['bin/strainledger.js', ...args], { cwd: ROOT, encoding: 'utf8', env: { ...process.env, CI: 'true' }, maxBuffer: 1 << 28 });
  if (r.status !== 0 && r.status !== 1) throw new Error(`exit ${r.status}: ${r.stderr.slice(0, 500)}`);
  return Number(process.hrtime.bigint() - t0) / 1e6;
}
const glob = join(dir, '*.json');
// The summary-table case takes ~0.3 s, where a 30 ms hiccup of the machine moves a median of a few
// rounds: it gets at least 15 rounds.
const scenarios = [
  ['summary table', (j) => ['run', glob, '--jobs', String(j)], Math.max(ROUNDS, 15)],
  ['--format html --out', (j) => ['run', glob, '--jobs', String(j), '--format', 'html', '--out', join(dir, `out-${j}`)], ROUNDS],
];
console.log(`batch of ${N} plans, ${ROUNDS} alternating rounds, median wall time (node ${process.version}, ${new Date().toISOString()})`);
for (const [what, args, rounds] of scenarios) {
  const t = { 1: [], 2: [] };
  for (let r = 0; r < rounds; r++) for (const j of [1, 2]) t[j].push(time(args(j)));
  const m1 = median(t[1]);
  const m2 = median(t[2]);
  console.log(`${what.padEnd(22)} (${rounds} rounds) --jobs 1 ${(m1 / 1000).toFixed(2)} s (${(N / (m1 / 1000)).toFixed(0)} plans/s)  --jobs 2 ${(m2 / 1000).toFixed(2)} s (${(N / (m2 / 1000)).toFixed(0)} plans/s)  speed-up ${(m1 / m2).toFixed(2)}×`);
}
rmSync(dir, { recursive: true, force: true });
