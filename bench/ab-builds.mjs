// Interleaved comparison of whole `analyze` processes of several builds on one record, timed to the millisecond.
//   node bench/ab-builds.mjs RECORD ROUNDS BIN [BIN ...] [-- EXTRA ANALYZE OPTIONS]
// Each round runs every BIN once, in the order given (`node BIN analyze RECORD --format json`, output discarded),
// timed around spawnSync with performance.now() (bench/ab-analyze.sh reads /usr/bin/time's 10 ms steps). Prints each
// build's median, fastest and mean. Alternating keeps a drift of the machine's load out of the comparison.
// An older build: `git worktree add /tmp/base REV && cd /tmp/base && npm ci && npm run build`, then BIN
// /tmp/base/bin/strainledger.js. A record: bench/records-gen.mjs writeInventedRecord(path, rows).
import { spawnSync } from 'node:child_process';

const args = process.argv.slice(2);
const dash = args.indexOf('--');
const extra = dash >= 0 ? args.slice(dash + 1) : [];
const [record, rounds, ...bins] = dash >= 0 ? args.slice(0, dash) : args;
if (!record || !bins.length) {
  console.error('usage: node bench/ab-builds.mjs RECORD ROUNDS BIN [BIN ...]');
  process.exit(2);
}
const times = bins.map(() => []);
for (let i = 0; i < Number(rounds); i++) {
  bins.forEach((bin, k) => {
    const t0 = performance.now();
    const r = spawnSync(process.execPath, [bin, 'analyze', record, '--format', 'json', ...extra], { stdio: 'ignore' });
    if (r.status !== 0) throw new Error(`${bin} exited ${r.status}`);
    times[k].push(performance.now() - t0);
  });
}
const med = (a) => [...a].sort((x, y) => x - y)[a.length >> 1];
bins.forEach((bin, k) => {
  const v = times[k];
  console.log(`${bin}: median ${med(v).toFixed(1)} ms, fastest ${Math.min(...v).toFixed(1)}, mean ${(v.reduce((a, b) => a + b, 0) / v.length).toFixed(1)} (${v.length} runs)`);
});
