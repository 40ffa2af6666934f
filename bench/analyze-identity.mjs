// Same results check for speed work on `analyze` (issue 12): `analyze FILE --format json` of this build against an
// older build, byte for byte, on every CSV under ../shared/datasets and examples/ (with and without --residuals)
// and on the INVENTED 100,000- and 1,000,000-row records of bench/records-gen.mjs (also with --threads 1 and 2).
// Not a benchmark: a guard to run before each commit of a speed change whose results must not change.
// Run after `npm run build`: BEFORE=/path/to/older/bin/strainledger.js node bench/analyze-identity.mjs
// (build the older commit in a scratch copy: git archive <commit> | tar -x -C /tmp/old; cd /tmp/old;
// ln -s <repo>/node_modules; npm run build). Exit code 1 and the differing runs listed when any differ.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { writeInventedRecord } from './records-gen.mjs';

const repo = join(import.meta.dirname, '..');
const before = process.env.BEFORE;
if (!before || !existsSync(before)) {
  console.error('set BEFORE=/path/to/older/bin/strainledger.js (a build of the commit to compare with)');
  process.exit(2);
}
const csvs = (dir) => (existsSync(dir) ? readdirSync(dir, { recursive: true }).filter((f) => String(f).endsWith('.csv')).map((f) => join(dir, String(f))).sort() : []);
const dir = mkdtempSync(join(tmpdir(), 'sl-identity-'));
const files = [...csvs(join(repo, '..', 'shared', 'datasets')), ...csvs(join(repo, 'examples'))];
const invented = [];
for (const rows of [100_000, 1_000_000]) {
  const f = join(dir, `r${rows}.csv`);
  await writeInventedRecord(f, rows);
  invented.push(f);
}
const run = (bin, args) => {
  const r = spawnSync(process.execPath, [bin, 'analyze', ...args, '--format', 'json'], { encoding: 'utf8', maxBuffer: 1 << 28 });
  return `${r.status}\n${r.stdout}`;
};
let compared = 0;
const differ = [];
for (const f of [...files, ...invented]) {
  for (const extra of [[], ['--residuals']]) {
    for (const threads of invented.includes(f) ? ['1', '2'] : ['1']) {
      const args = [f, ...extra, '--threads', threads];
      compared++;
      if (run(join(repo, 'bin', 'strainledger.js'), args) !== run(before, args)) differ.push(args.join(' '));
    }
  }
}
rmSync(dir, { recursive: true, force: true });
console.log(`${compared} runs of analyze --format json compared (${files.length} CSV files, 2 invented records): ${differ.length ? `${differ.length} differ` : 'all byte-identical'}`);
for (const d of differ) console.log(`  differs: ${d}`);
process.exit(differ.length ? 1 : 0);
