// Start-up of `strainledger help` (the overview) and `strainledger run --help` against `node -e 0`,
// interleaved rounds in one run, median wall time. With `--before DIR` (a folder holding another
// build's bin/strainledger.js and dist/runner/) both builds are measured side by side.
// Run: npm run build && node bench/help-startup.mjs [rounds=21] [--before DIR]
import { spawnSync } from 'node:child_process';
import { loadavg } from 'node:os';
import { join } from 'node:path';

const ROOT = new URL('..', import.meta.url).pathname;
const args = process.argv.slice(2);
const bi = args.indexOf('--before');
const before = bi >= 0 ? args.splice(bi, 2)[1] : undefined;
const ROUNDS = Number(args[0] ?? 21);
const builds = [['this build', join(ROOT, 'bin/strainledger.js')], ...(before ? [['before', join(before, 'bin/strainledger.js')]] : [])];
const cases = [{ name: 'node -e 0', args: ['-e', '0'] }];
for (const [label, bin] of builds) {
  cases.push({ name: `help (${label})`, args: [bin, 'help'] }, { name: `run --help (${label})`, args: [bin, 'run', '--help'] });
}
const times = cases.map(() => []);
for (let round = -2; round < ROUNDS; round++) {
  for (let i = 0; i < cases.length; i++) {
    const t0 = process.hrtime.bigint();
    const r = spawnSync(process.execPath, cases[i].args, { cwd: ROOT, encoding: 'utf8' });
    const ms = Number(process.hrtime.bigint() - t0) / 1e6;
    if (r.status !== 0) throw new Error(`${cases[i].name} exited ${r.status}: ${r.stderr}`);
    if (round >= 0) times[i].push(ms);
  }
}
const median = (a) => { const s = [...a].sort((x, y) => x - y); return s[(s.length - 1) >> 1]; };
console.log(`help start-up, ${ROUNDS} interleaved rounds, median wall time (node ${process.version}, load average ${loadavg()[0].toFixed(1)})`);
const base = median(times[0]);
for (let i = 0; i < cases.length; i++) console.log(`${cases[i].name.padEnd(28)} ${median(times[i]).toFixed(1).padStart(7)} ms   ${(median(times[i]) / base).toFixed(2)} × node -e 0`);
