// Runner cold start: median wall time of `strainledger run <demo> --format json` against `node -e 0`,
// measured side by side in one run (interleaved rounds, so machine noise hits all alike).
// Compares: the shipped bundle (bin/strainledger.js → dist/runner/), the plain tsc output
// (dist/cli/main.js, one module per source file), and `npx strainledger` (npm's launcher on top),
// with npm's launcher measured on its own (`npx node -e 0`) to show what it adds to any program.
// Run: npm run build && node bench/coldstart.mjs [rounds=21]
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const ROOT = new URL('..', import.meta.url).pathname;
const ROUNDS = Number(process.argv[2] ?? 21);
const DEMO = 'examples/contact-spring-strip.json';
const tmp = mkdtempSync(join(tmpdir(), 'sl-cold-'));
const tscLauncher = join(tmp, 'tsc-main.mjs');
writeFileSync(tscLauncher, `import { main } from ${JSON.stringify(join(ROOT, 'dist/cli/main.js'))};\nprocess.exitCode = await main(process.argv.slice(2), { stdout: (s) => process.stdout.write(s), stderr: (s) => process.stderr.write(s), isTTY: false });\n`);

const cases = [
  { name: 'node -e 0', cmd: process.execPath, args: ['-e', '0'] },
  { name: 'node bin/strainledger.js (bundle)', cmd: process.execPath, args: ['bin/strainledger.js', 'run', DEMO, '--format', 'json'] },
  { name: 'node dist/cli/main.js (tsc, unbundled)', cmd: process.execPath, args: [tscLauncher, 'run', DEMO, '--format', 'json'] },
  { name: 'npx strainledger', cmd: 'npx', args: ['strainledger', 'run', DEMO, '--format', 'json'] },
  // npm's launcher on its own, running nothing but node: what `npx` adds before any program starts.
  { name: 'npx node -e 0 (the launcher alone)', cmd: 'npx', args: ['--no-install', 'node', '-e', '0'] },
];
const times = cases.map(() => []);
// CPU time (user + sys) of each child via GNU time, where present: less sensitive than wall time
// to other processes sharing the cores (the wall-time ratio is the target; this explains it).
const TIME = existsSync('/usr/bin/time') ? '/usr/bin/time' : null;
const cpu = cases.map(() => []);
for (let round = -2; round < ROUNDS; round++) { // two warm-up rounds (disk cache), not counted
  for (let i = 0; i < cases.length; i++) {
    const c = cases[i];
    const t0 = process.hrtime.bigint();
    const [cmd, args] = TIME ? [TIME, ['-f', 'cpu %U %S', c.cmd, ...c.args]] : [c.cmd, c.args];
    const r = spawnSync(cmd, args, { cwd: ROOT, encoding: 'utf8', env: { ...process.env, CI: 'true' } });
    const m = /cpu ([\d.]+) ([\d.]+)\s*$/.exec(r.stderr ?? '');
    if (m && round >= 0) cpu[i].push((Number(m[1]) + Number(m[2])) * 1000);
    const ms = Number(process.hrtime.bigint() - t0) / 1e6;
    if (r.status !== 0) { c.failed = `exited ${r.status}: ${r.stderr.split('\n')[0]}`; continue; }
    if (round >= 0) times[i].push(ms);
  }
}
const median = (a) => { const s = [...a].sort((x, y) => x - y); return s[(s.length - 1) >> 1]; };
const base = median(times[0]);
console.log(`cold start, ${ROUNDS} interleaved rounds, median wall time (node ${process.version}, ${new Date().toISOString()}, load average ${(await import('node:os')).loadavg()[0].toFixed(1)})`);
for (let i = 0; i < cases.length; i++) {
  if (cases[i].failed) { console.log(`${cases[i].name.padEnd(40)} not measured (${cases[i].failed})`); continue; }
  const m = median(times[i]);
  const c = cpu[i].length ? `   cpu ${median(cpu[i]).toFixed(0).padStart(5)} ms  ${(median(cpu[i]) / median(cpu[0])).toFixed(2)}×` : '';
  console.log(`${cases[i].name.padEnd(40)} ${m.toFixed(1).padStart(7)} ms  ${(m / base).toFixed(2)}× node -e 0${c}`);
}
