// Sharding and merge (issue 13): N generated plans (INVENTED variations of the copper-strip demo),
// `run 'DIR/*.json' --format json` in one process versus the same list as 4 shards run one after the
// other (what 4 CI jobs would each pay: one start-up per shard), and `merge` of the 4 shard files
// (JSON, and JUnit). Side by side in one run, alternating, median of the rounds. The merged file is
// checked to equal the one-process file byte for byte in every round.
// Run: npm run build && node bench/shard-merge.mjs [plans=2000] [rounds=5]
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';

const ROOT = new URL('..', import.meta.url).pathname;
const N = Number(process.argv[2] ?? 2000);
const ROUNDS = Number(process.argv[3] ?? 5);
const SHARDS = 4;
const dir = mkdtempSync(join(tmpdir(), 'sl-shard-bench-'));
const outDir = mkdtempSync(join(tmpdir(), 'sl-shard-bench-out-')); // not under the plans' glob
for (let i = 0; i < N; i++) {
  const steps = [{ kind: 'roll', reductionPct: 10 + (i % 20) }, { kind: 'roll', reductionPct: 5 + ((i * 7) % 25) }];
  if (i % 3 === 0) steps.push({ kind: 'anneal' }, { kind: 'roll', reductionPct: 15 + (i % 10) });
  writeFileSync(join(dir, `plan-${String(i).padStart(5, '0')}.json`), JSON.stringify({
    name: `shard bench plan ${i} (INVENTED)`, units: 'SI',
    material: { name: 'copper, annealed (Callister handbook law)', elasticModulus: 115000, flowCurve: { law: 'hollomon', K: 530, n: 0.44 } },
    start: { thickness: 2, width: 40 }, steps, targets: { minYield: 300, maxYield: 470 },
  }));
}
const median = (a) => { const s = [...a].sort((x, y) => x - y); return s[(s.length - 1) >> 1]; };
function time(args, out) {
  const t0 = process.hrtime.bigint();
  const r = spawnSync(process.execPath, ['bin/strainledger.js', ...args], { cwd: ROOT, encoding: 'utf8', env: { ...process.env, CI: 'true' }, maxBuffer: 1 << 30 });
  const ms = Number(process.hrtime.bigint() - t0) / 1e6;
  if (r.status !== 0 && r.status !== 1) throw new Error(`exit ${r.status}: ${r.stderr.slice(0, 500)}`);
  if (out) writeFileSync(out, r.stdout);
  return { ms, stdout: r.stdout };
}
const glob = join(dir, '*.json');
const t = { whole: [], shards: [], mergeJson: [], mergeJunit: [] };
console.log(`${N} plans, ${SHARDS} shards, ${ROUNDS} alternating rounds, median wall time (node ${process.version}, load average ${loadavg().map((x) => x.toFixed(2)).join(' ')}, ${new Date().toISOString()})`);
for (let r = 0; r < ROUNDS; r++) {
  const whole = time(['run', glob, '--format', 'json']);
  t.whole.push(whole.ms);
  const wholeJunit = time(['run', glob, '--format', 'junit']).stdout;
  let sum = 0;
  for (let k = 1; k <= SHARDS; k++) {
    sum += time(['run', glob, '--shard', `${k}/${SHARDS}`, '--format', 'json'], join(outDir, `s${k}.out.json`)).ms;
    time(['run', glob, '--shard', `${k}/${SHARDS}`, '--format', 'junit'], join(outDir, `s${k}.out.xml`));
  }
  t.shards.push(sum);
  const mj = time(['merge', ...Array.from({ length: SHARDS }, (_, k) => join(outDir, `s${k + 1}.out.json`))]);
  t.mergeJson.push(mj.ms);
  if (mj.stdout !== whole.stdout) throw new Error('merged JSON differs from the one-process run');
  const mx = time(['merge', ...Array.from({ length: SHARDS }, (_, k) => join(outDir, `s${k + 1}.out.xml`))]);
  t.mergeJunit.push(mx.ms);
  if (mx.stdout !== wholeJunit) throw new Error('merged JUnit differs from the one-process run');
}
const mb = (f) => (readFileSync(join(outDir, f)).length / 1e6).toFixed(1);
console.log(`one process, all plans (JSON):         ${median(t.whole).toFixed(0)} ms`);
console.log(`${SHARDS} shards one after another (sum):     ${median(t.shards).toFixed(0)} ms  (${(median(t.shards) / median(t.whole)).toFixed(2)}× the one process; each CI job pays about a quarter)`);
console.log(`merge of ${SHARDS} JSON shard files (~${mb('s1.out.json')} MB each): ${median(t.mergeJson).toFixed(0)} ms`);
console.log(`merge of ${SHARDS} JUnit shard files:        ${median(t.mergeJunit).toFixed(0)} ms`);
console.log('merged output equal to the one-process output, byte for byte, in every round');
rmSync(dir, { recursive: true, force: true });
rmSync(outDir, { recursive: true, force: true });
